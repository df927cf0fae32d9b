/**
 * How each weather scenario is drawn: warmer red and long dashes, colder blue and short dashes, past years grey
 * and dotted, so colour is never the only cue.
 */
import type { TemperatureScenario } from '@loadwright/contracts';

/** Colour and dash of one scenario line. */
export interface ScenarioStyle {
  colour: string;
  dash: number[];
}

const pastYearColours = ['#5b6770', '#8a6d3b', '#40644a', '#7a4d6e', '#3d5a80'];

/** The style of the scenario at `index` among the past years (index counts past years only). */
export function scenarioStyle(scenario: Pick<TemperatureScenario, 'key' | 'kind'>, pastYearIndex = 0): ScenarioStyle {
  if (scenario.key === 'hotter') return { colour: '#b3261e', dash: [10, 4] };
  if (scenario.key === 'colder') return { colour: '#1f5fa8', dash: [4, 3] };
  return { colour: pastYearColours[pastYearIndex % pastYearColours.length]!, dash: [1, 3] };
}
