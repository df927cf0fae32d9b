/**
 * "2 Dec 01:36:10 CST": an instant in a stated time zone (the organisation's, or a series' own) with
 * the zone named, so a 7 a.m. reader never guesses which clock a time is on.
 */
export function clockText(iso: string | null, timeZone: string, withSeconds = true): string {
  if (!iso) return '—';
  return new Intl.DateTimeFormat('en-GB', {
    timeZone,
    day: 'numeric',
    month: 'short',
    hour: '2-digit',
    minute: '2-digit',
    ...(withSeconds ? { second: '2-digit' } : {}),
    hourCycle: 'h23',
    timeZoneName: 'short',
  })
    .format(new Date(iso))
    .replace(',', '');
}
