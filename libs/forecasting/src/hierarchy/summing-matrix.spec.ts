/**
 * The summing matrix of a small feeder tree, written out by hand below, and the refusals of malformed trees.
 */
import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { summingStructure } from './summing-matrix';

describe('summingStructure', () => {
  // system → zones north, south; north → feeders f1, f2; south → f3, and south's feeders meter all of it.
  const tree = [
    { key: 'system', parentKey: null },
    { key: 'north', parentKey: 'system' },
    { key: 'south', parentKey: 'system', remainder: false },
    { key: 'f1', parentKey: 'north' },
    { key: 'f2', parentKey: 'north' },
    { key: 'f3', parentKey: 'south' },
  ];

  it('adds a remainder under every parent whose children do not cover it, and writes S row by row', () => {
    const structure = summingStructure(tree);
    expect(structure.keys).toEqual(['system', 'north', 'south', 'f1', 'f2', 'f3', 'system:remainder', 'north:remainder']);
    expect(structure.bottomKeys).toEqual(['f1', 'f2', 'f3', 'system:remainder', 'north:remainder']);
    // Columns f1 f2 f3 system:remainder north:remainder; each row marks the bottom series under it (by hand).
    expect(structure.s.to2DArray()).toEqual([
      [1, 1, 1, 1, 1], // system = everything
      [1, 1, 0, 0, 1], // north = f1 + f2 + its unmetered remainder
      [0, 0, 1, 0, 0], // south = f3
      [1, 0, 0, 0, 0],
      [0, 1, 0, 0, 0],
      [0, 0, 1, 0, 0],
      [0, 0, 0, 1, 0],
      [0, 0, 0, 0, 1],
    ]);
    expect(structure.childrenOf.get('system')).toEqual(['north', 'south', 'system:remainder']);
    expect(structure.depthOf.get('north:remainder')).toBe(2);
    expect(structure.remainderOf.get('north:remainder')).toBe('north');
  });

  it('refuses two roots, an unknown parent, a cycle and a repeated key, naming the series', () => {
    const refusal = (nodes: { key: string; parentKey: string | null }[]) => {
      try {
        summingStructure(nodes);
      } catch (e) {
        expect(e).toBeInstanceOf(ForecastingError);
        return (e as Error).message;
      }
      return 'accepted';
    };
    expect(refusal([...tree, { key: 'other', parentKey: null }])).toMatch(/exactly one root.*got 2/);
    expect(refusal([...tree, { key: 'f4', parentKey: 'east' }])).toMatch(/"f4" names unknown parent "east"/);
    expect(refusal([...tree, { key: 'a', parentKey: 'b' }, { key: 'b', parentKey: 'a' }])).toMatch(/cycle/);
    expect(refusal([...tree, { key: 'f1', parentKey: 'south' }])).toMatch(/"f1" is listed twice/);
  });
});
