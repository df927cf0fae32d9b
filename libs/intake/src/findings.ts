/**
 * What validation finds, in the names the `validation_rule` enum uses, and a tally that keeps counts
 * and the first few examples per rule so a report never holds a whole file's findings in memory.
 */
import type { validationRule } from '@loadwright/db';

/** One validation rule, as stored in upload_findings.rule. */
export type RuleName = (typeof validationRule.enumValues)[number];

/** One thing a rule found, tied to a reading where there is one. */
export interface Finding {
  rule: RuleName;
  seriesId: number | null;
  /** UTC epoch ms of the reading, or null when the finding is about a row with no usable time. */
  tsMs: number | null;
  value: number | null;
  /** 1-based line in the source file, when the reading came from a file. */
  sourceRow: number | null;
  /** Rule-specific facts: the limit crossed, the method of an estimate, the interval count of a gap. */
  detail: Record<string, unknown>;
}

/** How many examples a tally keeps per rule. */
export const examplesPerRule = 10;

/** Counts per rule and up to `examplesPerRule` examples of each. */
export class FindingTally {
  /** Findings counted per rule. */
  readonly counts = new Map<RuleName, number>();
  /** The first findings of each rule, in the order they were added. */
  readonly examples = new Map<RuleName, Finding[]>();

  /** Counts a finding and keeps it as an example while fewer than the limit are kept. */
  add(finding: Finding): void {
    this.counts.set(finding.rule, (this.counts.get(finding.rule) ?? 0) + 1);
    const kept = this.examples.get(finding.rule) ?? [];
    if (kept.length < examplesPerRule) kept.push(finding);
    this.examples.set(finding.rule, kept);
  }

  /** Adds every finding of another tally (counts in full, examples up to the limit). */
  merge(other: FindingTally): void {
    for (const [rule, count] of other.counts) {
      this.counts.set(rule, (this.counts.get(rule) ?? 0) + count);
      const kept = this.examples.get(rule) ?? [];
      for (const example of other.examples.get(rule) ?? []) if (kept.length < examplesPerRule) kept.push(example);
      this.examples.set(rule, kept);
    }
  }

  /** Total findings over all rules. */
  get total(): number {
    let sum = 0;
    for (const count of this.counts.values()) sum += count;
    return sum;
  }

  /** Counts as a plain object, for JSON. */
  countsByRule(): Partial<Record<RuleName, number>> {
    return Object.fromEntries(this.counts) as Partial<Record<RuleName, number>>;
  }
}
