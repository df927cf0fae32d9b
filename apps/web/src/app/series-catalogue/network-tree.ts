import { type SeriesSummary, seriesLevelDepth } from '@loadwright/contracts';

/** One choice of the hierarchy filter: a system, zone or substation, indented under its parent. */
export interface NetworkNode {
  readonly id: number;
  readonly key: string;
  readonly name: string;
  readonly level: NonNullable<SeriesSummary['level']>;
  /** 0 for a top-level node, 1 for its children, and so on. */
  readonly depth: number;
}

/**
 * The load series that can hold others (every level above feeder), in tree order: each node followed
 * by its children, siblings by key. A node whose parent is not in the list starts a tree of its own.
 */
export function networkTree(series: readonly SeriesSummary[]): NetworkNode[] {
  const holders = series.filter((s) => s.kind === 'load' && s.level !== null && s.level !== 'feeder');
  const ids = new Set(holders.map((s) => s.id));
  const children = new Map<number | null, SeriesSummary[]>();
  for (const s of holders) {
    const parent = s.parentId !== null && ids.has(s.parentId) ? s.parentId : null;
    children.set(parent, [...(children.get(parent) ?? []), s]);
  }
  const order = (a: SeriesSummary, b: SeriesSummary) =>
    seriesLevelDepth[a.level!] - seriesLevelDepth[b.level!] || a.key.localeCompare(b.key);
  const nodes: NetworkNode[] = [];
  const visit = (parent: number | null, depth: number) => {
    for (const s of [...(children.get(parent) ?? [])].sort(order)) {
      nodes.push({ id: s.id, key: s.key, name: s.name, level: s.level!, depth });
      visit(s.id, depth + 1);
    }
  };
  visit(null, 0);
  return nodes;
}
