/**
 * The steward's answers to the repeated daylight-saving hours an import stopped to ask about: every
 * asked hour needs exactly one choice, and nothing else may be answered. The answers join the upload's
 * settings, so the resumed import (and any retry of it) reads the hours the same way.
 */
import type { RepeatedHourChoice, RepeatedHourQuestion, UploadSettings } from '@loadwright/contracts';
import { foldSeriesKey } from './series-key';

/** The settings with the choices added, or the sentence and the choice's index saying what is wrong. */
export function settingsWithChoices(
  settings: UploadSettings,
  questions: readonly RepeatedHourQuestion[],
  choices: readonly RepeatedHourChoice[],
): { ok: true; settings: UploadSettings } | { ok: false; message: string; index: number | null } {
  const keyOf = (seriesKey: string, local: string) => `${foldSeriesKey(seriesKey)} ${local}`;
  const asked = new Map(questions.map((question) => [keyOf(question.seriesKey, question.local), question]));
  const answered = new Map<string, RepeatedHourChoice>();
  for (const [index, choice] of choices.entries()) {
    const key = keyOf(choice.seriesKey, choice.local);
    const question = asked.get(key);
    if (!question)
      return {
        ok: false,
        index,
        message: `Series "${choice.seriesKey}" has no repeated hour at ${choice.local} to choose for; choose only for the hours the upload lists.`,
      };
    if (answered.has(key))
      return {
        ok: false,
        index,
        message: `${question.local} of series "${question.seriesKey}" is chosen twice; choose once for each hour.`,
      };
    answered.set(key, { ...choice, seriesKey: question.seriesKey });
  }
  const open = questions.filter((question) => !answered.has(keyOf(question.seriesKey, question.local)));
  if (open.length > 0)
    return {
      ok: false,
      index: null,
      message: `Choose for every repeated hour: ${open.length} still ${open.length === 1 ? 'has' : 'have'} no choice, the first ${open[0]!.local} (${open[0]!.timeZone}) of series "${open[0]!.seriesKey}".`,
    };
  // Earlier answers for other hours stay; an hour answered again takes the new answer.
  const kept = (settings.repeatedHourChoices ?? []).filter((choice) => !answered.has(keyOf(choice.seriesKey, choice.local)));
  return { ok: true, settings: { ...settings, repeatedHourChoices: [...kept, ...answered.values()] } };
}
