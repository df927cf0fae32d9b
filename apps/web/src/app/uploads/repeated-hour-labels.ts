import type { RepeatedHourChoiceKind, RepeatedHourQuestion } from '@loadwright/contracts';

/** Why file order could not place the hour, in a sentence. */
export function reasonWords(question: RepeatedHourQuestion): string {
  return question.reason === 'rows-out-of-order'
    ? "The file's rows for this series are not in time order, so their order cannot tell daylight from standard time."
    : 'The file holds one reading at this time, which occurs twice, so nothing tells whether it is daylight or standard time.';
}

/** A clock time with its zone's abbreviation, e.g. "01:00 CDT", read in the question's zone. */
export function zonedClock(iso: string, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-US', {
    timeZone,
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    timeZoneName: 'short',
  }).formatToParts(new Date(iso));
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('hour')}:${part('minute')} ${part('timeZoneName')}`;
}

/** The words of each choice for one hour: which row becomes daylight time, or dropping. */
export function choiceWords(question: RepeatedHourQuestion): Record<RepeatedHourChoiceKind, string> {
  const daylight = zonedClock(question.daylightStart, question.timeZone);
  const standard = zonedClock(question.standardStart, question.timeZone);
  const [first, second] = question.readings;
  const row = (reading: { sourceRow: number } | undefined) => (reading ? `row ${reading.sourceRow}` : '');
  if (!second)
    return {
      'first-is-daylight': `It is daylight time (${daylight})`,
      'second-is-daylight': `It is standard time (${standard})`,
      drop: 'Drop this reading',
    };
  return {
    'first-is-daylight': `${capital(row(first))} is daylight time (${daylight}), ${row(second)} standard time (${standard})`,
    'second-is-daylight': `${capital(row(second))} is daylight time (${daylight}), ${row(first)} standard time (${standard})`,
    drop: `Drop ${question.readings.length === 2 ? 'both readings' : `all ${question.readings.length} readings`}`,
  };
}

function capital(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
