import { qualityFlag } from '@loadwright/db';
import { describe, expect, it } from 'vitest';
import { ReadingColumns } from '../reading-columns';
import { collapseDuplicates } from './duplicates';

describe('collapseDuplicates', () => {
  it('sorts, drops an equal repeat, keeps the first of a conflicting pair and flags it', () => {
    const columns = new ReadingColumns();
    columns.push(3000, 3, 2);
    columns.push(1000, 1, 3);
    columns.push(3000, 3, 4);
    columns.push(2000, 2, 5);
    columns.push(2000, 9, 6);
    const { readings, findings } = collapseDuplicates(columns, 1);
    expect([...readings.ts]).toEqual([1000, 2000, 3000]);
    expect([...readings.values]).toEqual([1, 2, 3]);
    expect([...readings.flags]).toEqual([0, qualityFlag.duplicateConflict, 0]);
    expect(findings.map((f) => [f.rule, f.sourceRow, f.detail])).toEqual([
      ['duplicate_conflict', 6, { keptValue: 2, keptRow: 5, resolution: 'first kept' }],
      ['duplicate_equal', 4, { keptRow: 2 }],
    ]);
  });
});
