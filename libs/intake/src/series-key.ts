/**
 * How a series key written in a file or a mapping finds its catalogue entry. Keys are matched
 * without regard to case or surrounding spaces (`F-101` in a meter export is the catalogue's
 * `f-101`), the same rule for the mapping proposal, the plan and the import. When the catalogue
 * holds two keys that differ only by case, only the exact spelling finds either of them.
 */
import type { CatalogueEntry } from './catalogue-entry';

/** The form keys are compared in: trimmed, lower case. */
export function foldSeriesKey(key: string): string {
  return key.trim().toLowerCase();
}

/** Finds catalogue entries by key as described above. */
export class SeriesKeyIndex {
  private readonly exact = new Map<string, CatalogueEntry>();
  private readonly folded = new Map<string, CatalogueEntry | null>();

  constructor(catalogue: readonly CatalogueEntry[]) {
    for (const entry of catalogue) {
      this.exact.set(entry.key, entry);
      const folded = foldSeriesKey(entry.key);
      // null marks a folded key that two catalogue keys share: ambiguous unless spelled exactly.
      this.folded.set(folded, this.folded.has(folded) ? null : entry);
    }
  }

  /** The entry a written key names, or null. */
  find(written: string): CatalogueEntry | null {
    return this.exact.get(written) ?? this.exact.get(written.trim()) ?? this.folded.get(foldSeriesKey(written)) ?? null;
  }

  /** True when the written key names an entry. */
  has(written: string): boolean {
    return this.find(written) !== null;
  }
}
