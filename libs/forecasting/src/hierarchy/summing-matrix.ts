/**
 * The summing matrix S of a load hierarchy: which bottom-level series add up to each series.
 *
 * Model: y_t = S b_t, where y_t stacks every series of the hierarchy (n rows) and b_t the bottom-level
 * series (m columns); S[i][j] = 1 when bottom series j lies under (or is) series i.
 *
 * Method: Hyndman & Athanasopoulos (2021), Forecasting: Principles and Practice, 3rd ed., §11.1
 * (hierarchical time series and the summing matrix); Wickramasuriya, Athanasopoulos & Hyndman (2019),
 * JASA 114(526), §2.
 *
 * Conventions: a parent whose metered children do not cover it (unmetered load, losses, customers fed
 * straight from the substation bus) gets an explicit *remainder* series, parent − Σ children, which is a
 * bottom-level series of its own, so that the identity parent = Σ children + remainder is exact. Rows are
 * the nodes in the order given, then the remainders in the order of their parents; columns are the leaf
 * nodes and remainders in row order. A node's parent must be listed before or after it, but the tree
 * must have exactly one root and no cycles.
 *
 * @throws ForecastingError('invalid-argument') for duplicate keys, an unknown parent, no root or several
 *   roots, a cycle, or a remainder key that clashes with a node key.
 *
 * References: Hyndman & Athanasopoulos (2021) §11.1; Wickramasuriya et al. (2019) §2.
 */
import { Matrix } from 'ml-matrix';
import { ForecastingError } from '../core/errors';

/** One series of the hierarchy. */
export interface HierarchyNode {
  /** Stable identifier (the series key). */
  key: string;
  /** Key of the series this one adds into; null for the root (the system). */
  parentKey: string | null;
  /**
   * Whether this parent's children leave part of it unmetered, so it needs a remainder series. Ignored on
   * leaves. Default true: a utility's metered children rarely cover every loss and unmetered customer.
   */
  remainder?: boolean;
}

/** The summing structure: row and column keys and S itself. */
export interface SummingStructure {
  /** Every series in row order: the nodes as given, then each remainder. */
  keys: string[];
  /** The bottom-level series (columns of S): leaves and remainders, in row order. */
  bottomKeys: string[];
  /** Remainder key → the parent it completes. */
  remainderOf: Map<string, string>;
  /** Key → parent key (null for the root), including remainders. */
  parentOf: Map<string, string | null>;
  /** Key → its direct children (including its remainder), in row order. */
  childrenOf: Map<string, string[]>;
  /** Key → depth below the root (root 0). */
  depthOf: Map<string, number>;
  /** The n × m summing matrix. */
  s: Matrix;
}

/** The default name of a parent's remainder series. */
export function remainderKey(parentKey: string): string {
  return `${parentKey}:remainder`;
}

/** Builds S from a parent/children list; see the file comment for the remainder convention. */
export function summingStructure(nodes: HierarchyNode[], nameRemainder: (parentKey: string) => string = remainderKey): SummingStructure {
  const fn = 'summingStructure';
  if (nodes.length === 0) throw new ForecastingError('invalid-argument', fn, 'needs at least one series');
  const parentOf = new Map<string, string | null>();
  for (const node of nodes) {
    if (parentOf.has(node.key)) throw new ForecastingError('invalid-argument', fn, `series "${node.key}" is listed twice`);
    parentOf.set(node.key, node.parentKey);
  }
  const roots = nodes.filter((n) => n.parentKey === null);
  if (roots.length !== 1) {
    throw new ForecastingError('invalid-argument', fn, `needs exactly one root (a series with no parent), got ${roots.length}`);
  }
  const childrenOf = new Map<string, string[]>(nodes.map((n) => [n.key, []]));
  for (const node of nodes) {
    if (node.parentKey === null) continue;
    const siblings = childrenOf.get(node.parentKey);
    if (!siblings) throw new ForecastingError('invalid-argument', fn, `series "${node.key}" names unknown parent "${node.parentKey}"`);
    siblings.push(node.key);
  }
  const depthOf = new Map<string, number>();
  for (const node of nodes) {
    let depth = 0;
    let at: string | null = node.key;
    while ((at = parentOf.get(at) ?? null) !== null) {
      if (++depth > nodes.length) throw new ForecastingError('invalid-argument', fn, `series "${node.key}" sits on a cycle of parents`);
    }
    depthOf.set(node.key, depth);
  }

  const keys = nodes.map((n) => n.key);
  const remainderOf = new Map<string, string>();
  for (const node of nodes) {
    if ((childrenOf.get(node.key) ?? []).length === 0 || node.remainder === false) continue;
    const key = nameRemainder(node.key);
    if (parentOf.has(key) || remainderOf.has(key)) {
      throw new ForecastingError('invalid-argument', fn, `remainder key "${key}" clashes with another series`);
    }
    remainderOf.set(key, node.key);
    keys.push(key);
    parentOf.set(key, node.key);
    childrenOf.get(node.key)!.push(key);
    childrenOf.set(key, []);
    depthOf.set(key, depthOf.get(node.key)! + 1);
  }
  const bottomKeys = keys.filter((k) => childrenOf.get(k)!.length === 0);
  const column = new Map(bottomKeys.map((k, j) => [k, j]));
  const s = Matrix.zeros(keys.length, bottomKeys.length);
  const row = new Map(keys.map((k, i) => [k, i]));
  for (const bottom of bottomKeys) {
    // Walk from the bottom series up to the root, marking every series it adds into.
    let at: string | null = bottom;
    while (at !== null) {
      s.set(row.get(at)!, column.get(bottom)!, 1);
      at = parentOf.get(at) ?? null;
    }
  }
  return { keys, bottomKeys, remainderOf, parentOf, childrenOf, depthOf, s };
}
