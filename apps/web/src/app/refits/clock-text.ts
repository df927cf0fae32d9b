/** "2 Dec 01:36:10 UTC": an instant in this browser's time zone, with the zone named so 7 a.m. readers need not guess. */
export function clockText(iso: string | null, withSeconds = true): string {
  if (!iso) return '—';
  return new Intl.DateTimeFormat('en-GB', {
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
