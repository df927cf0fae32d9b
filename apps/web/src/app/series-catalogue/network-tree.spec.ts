import type { SeriesSummary } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { networkTree } from './network-tree';

let nextId = 1;
/** A catalogue row with only the fields the tree reads filled in. */
function row(key: string, level: SeriesSummary['level'], parentId: number | null, kind: SeriesSummary['kind'] = 'load'): SeriesSummary {
  return { id: nextId++, key, name: key.toUpperCase(), kind, level, parentId } as SeriesSummary;
}

describe('networkTree', () => {
  it('lists system, zones and substations depth first, leaves out feeders and temperatures', () => {
    const sys = row('sys', 'system', null);
    const south = row('zone-south', 'zone', sys.id);
    const north = row('zone-north', 'zone', sys.id);
    const sub = row('sub-harrow', 'substation', north.id);
    const rows = [south, row('fdr-n1', 'feeder', sub.id), sub, row('wx-upland', null, null, 'temperature'), north, sys];
    expect(networkTree(rows).map((n) => `${'  '.repeat(n.depth)}${n.key}`)).toEqual([
      'sys',
      '  zone-north',
      '    sub-harrow',
      '  zone-south',
    ]);
  });

  it('starts a tree of its own for a node whose parent is not listed (e.g. archived)', () => {
    const orphan = row('zone-east', 'zone', 9999);
    expect(networkTree([orphan])).toEqual([{ id: orphan.id, key: 'zone-east', name: 'ZONE-EAST', level: 'zone', depth: 0 }]);
  });
});
