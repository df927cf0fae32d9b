/** Whether two sets of model settings are the same, whatever order their keys come in (jsonb reorders them). */
import type { ModelSettingsRequest } from '@loadwright/contracts';

/** True when `a` and `b` hold the same settings. */
export function sameSettings(a: ModelSettingsRequest, b: ModelSettingsRequest): boolean {
  return canonical(a) === canonical(b);
}

/** JSON with object keys sorted at every level. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${canonical(item)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}
