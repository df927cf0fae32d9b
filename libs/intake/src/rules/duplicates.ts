/**
 * Sorting and duplicate instants. Readings are put in time order (stable: file order breaks ties);
 * a repeat of an instant with the same value is dropped and counted (`duplicate_equal`); a repeat
 * with a different value is dropped too, the first reading of the instant is kept and flagged
 * `duplicateConflict`, and a `duplicate_conflict` finding names both values. Keeping the first is a
 * choice, stated so: a file rarely says which of two readings is right, and the first is the one
 * the file itself put forward; the finding lets the steward correct it with a later upload.
 */
import { qualityFlag } from '@loadwright/db';
import type { Finding } from '../findings';
import { pickReadings, type SeriesReadings } from '../series-readings';

/** Sorted readings with one reading per instant, and what was dropped. */
export interface CollapsedReadings {
  readings: SeriesReadings;
  findings: Finding[];
}

/** Sorts by time and collapses repeated instants as described above. Pure. */
export function collapseDuplicates(source: SeriesReadings, seriesId: number): CollapsedReadings {
  const n = source.length;
  let order: Int32Array | null = null;
  for (let i = 1; i < n; i++) {
    if (source.ts[i]! < source.ts[i - 1]!) {
      order = Int32Array.from({ length: n }, (_, k) => k).sort((a, b) => source.ts[a]! - source.ts[b]! || a - b);
      break;
    }
  }
  const at = (k: number) => (order ? order[k]! : k);
  const kept = new Int32Array(n);
  let count = 0;
  const findings: Finding[] = [];
  const flags = new Uint16Array(source.flags.subarray(0, n));
  for (let k = 0; k < n; k++) {
    const i = at(k);
    const previous = count > 0 ? kept[count - 1]! : -1;
    if (previous < 0 || source.ts[previous] !== source.ts[i]) {
      kept[count++] = i;
      continue;
    }
    const equal = source.values[previous] === source.values[i];
    if (!equal) flags[previous]! |= qualityFlag.duplicateConflict;
    findings.push({
      rule: equal ? 'duplicate_equal' : 'duplicate_conflict',
      seriesId,
      tsMs: source.ts[i]!,
      value: source.values[i]!,
      sourceRow: source.sourceRows[i] || null,
      detail: equal
        ? { keptRow: source.sourceRows[previous] || null }
        : { keptValue: source.values[previous], keptRow: source.sourceRows[previous] || null, resolution: 'first kept' },
    });
  }
  const readings = pickReadings({ ...source, flags }, kept, count);
  return { readings, findings };
}
