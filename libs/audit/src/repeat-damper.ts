/**
 * Keeps repeated events from flooding the audit log: the first event of a kind (a key such as
 * "token 12 refused as revoked") is written, repeats within the window are only counted, and the next
 * entry written for that key says how many were folded into it. An admin reads one line per caller
 * and problem every few minutes, with the count, instead of one line per poll of a forgotten script.
 */

/** The decision for one event. */
export interface DamperDecision {
  /** Write an audit entry for this event. */
  record: boolean;
  /** Events of this key that were not written since the last written one. */
  repeatsSinceLast: number;
}

/** Decides which of a stream of keyed events to write. */
export interface RepeatDamper {
  decide(key: string, now?: number): DamperDecision;
}

/** A damper that writes at most one event per key every `windowMs`, remembering at most `maxKeys` keys. */
export function createRepeatDamper({ windowMs, maxKeys = 10_000 }: { windowMs: number; maxKeys?: number }): RepeatDamper {
  const seen = new Map<string, { writtenAt: number; folded: number }>();
  return {
    decide(key, now = Date.now()) {
      const entry = seen.get(key);
      if (entry && now - entry.writtenAt < windowMs) {
        entry.folded += 1;
        return { record: false, repeatsSinceLast: entry.folded };
      }
      const repeatsSinceLast = entry?.folded ?? 0;
      seen.delete(key); // re-insert so the map's order is least recently written first
      if (seen.size >= maxKeys) seen.delete(seen.keys().next().value!);
      seen.set(key, { writtenAt: now, folded: 0 });
      return { record: true, repeatsSinceLast };
    },
  };
}
