/** Which forecast version was in force for an hour: the approved one, the draft where none was approved. */

/** A version as the choice needs it. */
export interface VersionSpan {
  id: number;
  origin: Date;
  horizonHours: number;
  /** Set when a planner approved it (it stays set after it is superseded). */
  approvedAt: Date | null;
}

/**
 * The version in force for the hour starting at `ts`: among the versions covering it
 * (origin ≤ ts < origin + horizon), the approved one with the latest origin; where none covering it
 * was approved, the draft with the latest origin (ties go to the later version). Null when none covers it.
 */
export function versionInForce<V extends VersionSpan>(versions: readonly V[], ts: Date): V | null {
  const t = ts.getTime();
  let approved: V | null = null;
  let draft: V | null = null;
  const later = (a: V | null, b: V) => !a || b.origin > a.origin || (b.origin.getTime() === a.origin.getTime() && b.id > a.id);
  for (const version of versions) {
    const start = version.origin.getTime();
    if (t < start || t >= start + version.horizonHours * 3_600_000) continue;
    if (version.approvedAt) {
      if (later(approved, version)) approved = version;
    } else if (later(draft, version)) draft = version;
  }
  return approved ?? draft;
}
