import { zoneAbbreviation } from '../series-page/zoned-time';

/**
 * "2 Dec 01:36:10 CST": an instant in a stated time zone (the organisation's, or a series' own) with
 * the zone named, so a 7 a.m. reader never guesses which clock a time is on. The zone is named as on the
 * series page's times (en-US short names: "CST", not en-GB's "GMT-6"), so one screen never shows both.
 */
export function clockText(iso: string | null, timeZone: string, withSeconds = true): string {
  if (!iso) return '—';
  const time = new Intl.DateTimeFormat('en-GB', {
    timeZone,
    day: 'numeric',
    month: 'short',
    hour: '2-digit',
    minute: '2-digit',
    ...(withSeconds ? { second: '2-digit' } : {}),
    hourCycle: 'h23',
  })
    .format(new Date(iso))
    .replace(',', '');
  return `${time} ${zoneAbbreviation(iso, timeZone)}`;
}
