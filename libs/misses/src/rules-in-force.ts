/**
 * Which rules apply to a series: the admin's defaults (scope `all`) unless a planner has overridden a
 * kind for the series' level (its group) or for the series itself. The most specific scope that has
 * any rule of a kind wins for that kind; an inactive override switches the kind off there.
 */
import type { MissRuleKind, MissSeverity, RuleSettings } from './rule-kinds';

/** A rule as stored. */
export interface ScopedRule extends RuleSettings {
  id: number;
  name: string;
  scope: 'all' | 'level' | 'series';
  scopeLevel: string | null;
  scopeSeriesId: number | null;
  active: boolean;
  severity: MissSeverity;
  /** E-mail addresses, or `role:<role>` for everyone active in a role. */
  recipients: string[];
}

const specificity = { all: 0, level: 1, series: 2 } as const;

/** The active rules in force for a series of `level` with id `seriesId`. */
export function rulesInForce<R extends ScopedRule>(rules: readonly R[], series: { id: number; level: string | null }): R[] {
  const applicable = rules.filter(
    (rule) =>
      rule.scope === 'all' ||
      (rule.scope === 'level' && rule.scopeLevel === series.level) ||
      (rule.scope === 'series' && rule.scopeSeriesId === series.id),
  );
  const byKind = new Map<MissRuleKind, R[]>();
  for (const rule of applicable) byKind.set(rule.kind, [...(byKind.get(rule.kind) ?? []), rule]);
  const inForce: R[] = [];
  for (const candidates of byKind.values()) {
    const top = Math.max(...candidates.map((rule) => specificity[rule.scope]));
    inForce.push(...candidates.filter((rule) => specificity[rule.scope] === top && rule.active));
  }
  return inForce.sort((a, b) => a.id - b.id);
}
