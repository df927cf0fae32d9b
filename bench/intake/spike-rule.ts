/**
 * The spike rule on clean load and on injected spikes, side by side: the Hampel identifier alone
 * (the rule before) against the same identifier judged against the series' own daily and weekly
 * shape (libs/intake/src/rules/shape-spikes.ts, the rule now).
 *
 * Clean load: the generated history of our invented co-op, Tallowmere Valley (fixtures/demo, its
 * scenario seed) with every scenario defect removed, so any flag on it is a false alarm. Real load:
 * PJM East hourly metered load for 2002 (fixtures/reference/data/pjm-east-2002.json names its source),
 * a system total on its local clock; its flags are read as false alarms too, though a real series may
 * hold a real defect (the source has two isolated one-hour jumps). A second clean set sharpens each
 * feeder's morning (+12 % at 07:00 and 08:00 local time, every day), the shape the issue reports as
 * flagged (3,011 and 2,988 kW beside 2,687 and 2,860).
 *
 * Detection: into each load series, 120 spikes at seeded random hours at least 48 hours apart
 * (away from the first and last week), multiplying the reading by 1.3, 1.5, 2 or 3, or dividing it
 * by 2 (a dip), 24 of each. A spike counts as found when the rule flags its hour.
 *
 * `npm run bench -- spike-rule`
 */
import { generateDemo } from '../../fixtures/demo/generate';
import { createRandom, streamSeed } from '../../fixtures/demo/random';
import { demoScenario } from '../../fixtures/demo/scenario';
import { demoCatalogue } from '../../fixtures/demo/catalogue';
import { hampelOutliers } from '../../libs/intake/src/rules/hampel-spikes';
import { shapeSpikes } from '../../libs/intake/src/rules/shape-spikes';
import { offsetMsAt } from '../../libs/intake/src/time-zone-offset';
import { REAL_LOAD_NAME, realHourlyLoad } from '../../libs/refits/src/evaluation/real-load.testing';
import type { Benchmark, BenchReport } from '../support/harness';

const zone = demoScenario.organisation.timeZone;
const startMs = Date.parse(demoScenario.start);

/** The rules compared. */
const rules = {
  'Hampel alone (before)': (values: Float64Array, _grid: Float64Array) => hampelOutliers(values, values.length),
  'Hampel + daily/weekly shape (now)': (values: Float64Array, grid: Float64Array) =>
    shapeSpikes(values, grid, values.length, 60, (g) => offsetMsAt(zone, startMs + g * 3_600_000) / 3_600_000),
} as const;
type RuleName = keyof typeof rules;

/** Spike factors injected, 24 of each per series. */
const factors = [1.3, 1.5, 2, 3, 0.5] as const;

/** Hours, from the scenario start, whose local time is 07:00 or 08:00 in the co-op's zone. */
function morningHours(startMs: number, length: number): boolean[] {
  const format = new Intl.DateTimeFormat('en-GB', { timeZone: demoScenario.organisation.timeZone, hour: '2-digit', hourCycle: 'h23' });
  return Array.from({ length }, (_, i) => {
    const hour = Number(format.format(new Date(startMs + i * 3_600_000)));
    return hour === 7 || hour === 8;
  });
}

/**
 * Injects the bench's spikes into one series (24 per factor, seeded by its key, at least 48 hours
 * apart and a week from either end) and returns where they went and what `rule` flagged.
 */
function injectAndFlag(rule: (values: Float64Array) => number[], series: { key: string; values: ArrayLike<number> }, seed: number) {
  const random = createRandom(streamSeed(seed, `spikes:${series.key}`));
  const values = Float64Array.from(series.values);
  const at = new Map<number, number>();
  const margin = 7 * 24;
  while (at.size < 24 * factors.length) {
    const hour = margin + Math.floor(random.uniform() * (values.length - 2 * margin));
    if ([...at.keys()].some((other) => Math.abs(other - hour) < 48)) continue;
    at.set(hour, factors[at.size % factors.length]!);
  }
  for (const [hour, factor] of at) values[hour] = values[hour]! * factor;
  return { at, flagged: new Set(rule(values)) };
}

/** The benchmark. */
export const bench: Benchmark = {
  name: 'spike-rule',
  description: 'Spike rule: false alarms on clean load and detection of injected spikes, Hampel alone against Hampel judged by the shape',
  run(): BenchReport {
    const data = generateDemo({ ...demoScenario, defects: [] });
    const loadKeys = new Set(
      demoCatalogue(demoScenario)
        .filter((entry) => entry.kind === 'load')
        .map((entry) => entry.key),
    );
    const load = data.series.filter((series) => loadKeys.has(series.key));
    const grid = Float64Array.from({ length: data.length }, (_, i) => i);
    const morning = morningHours(data.startMs, data.length);
    const feeders = new Set(demoScenario.feeders.map((feeder) => feeder.key));
    const sharpened = load
      .filter((series) => feeders.has(series.key))
      .map((series) => ({
        key: series.key,
        values: series.values.map((value, i) => (morning[i] ? Math.round(value * 1.12 * 10) / 10 : value)),
      }));

    const rows: BenchReport['rows'] = [];
    const data_: Record<string, unknown> = {};
    const falseAlarms = (name: RuleName, set: typeof load) => set.reduce((sum, series) => sum + rules[name](series.values, grid).length, 0);
    const readings = (set: typeof load) => set.reduce((sum, series) => sum + series.values.length, 0);

    const detection = (name: RuleName) => {
      const found = new Map<number, number>(factors.map((factor) => [factor, 0]));
      let injected = 0;
      let extra = 0;
      for (const series of load) {
        const { at, flagged } = injectAndFlag((values) => rules[name](values, grid), series, data.seed);
        injected += at.size;
        for (const [hour, factor] of at) if (flagged.has(hour)) found.set(factor, found.get(factor)! + 1);
        for (const hour of flagged) if (!at.has(hour)) extra++;
      }
      return { found, injected, extra };
    };

    // Real load on its local clock, 24 values a day, so the shape rule's days line up with no zone offset.
    const real = [{ key: 'pjm-east-2002', values: Array.from(realHourlyLoad().data.values) }];
    const realGrid = Float64Array.from(real[0]!.values, (_, i) => i);
    const realRules = {
      'Hampel alone (before)': (values: Float64Array) => hampelOutliers(values, values.length),
      'Hampel + daily/weekly shape (now)': (values: Float64Array) => shapeSpikes(values, realGrid, values.length, 60),
    } as const;

    const results: Record<string, { clean: number; sharpened: number; found: Map<number, number>; injected: number; real: number }> = {};
    for (const name of Object.keys(rules) as RuleName[]) {
      const clean = falseAlarms(name, load);
      const sharp = falseAlarms(name, sharpened);
      const { found, injected, extra } = detection(name);
      const realFlags = realRules[name](Float64Array.from(real[0]!.values)).length;
      const realDetection = injectAndFlag(realRules[name], real[0]!, data.seed);
      const realFound = [...realDetection.at.keys()].filter((hour) => realDetection.flagged.has(hour)).length;
      results[name] = { clean, sharpened: sharp, found, injected, real: realFlags };
      const perFactor = injected / factors.length;
      rows.push({
        rule: name,
        'clean readings': readings(load),
        'false alarms': clean,
        'per 100k': Math.round((clean / readings(load)) * 1e5 * 10) / 10,
        'sharp-morning readings': readings(sharpened),
        'false alarms (sharp)': sharp,
        ...Object.fromEntries(factors.map((factor) => [`found ×${factor}`, `${found.get(factor)}/${perFactor}`])),
        'found %': Math.round(([...found.values()].reduce((a, b) => a + b, 0) / injected) * 1000) / 10,
        'other flags': extra,
        'real-load readings': real[0]!.values.length,
        'flags on real load': realFlags,
        'found % in real load': Math.round((realFound / realDetection.at.size) * 1000) / 10,
      });
      data_[name] = { clean, sharpened: sharp, injected, found: Object.fromEntries(found), extra };
    }
    const before = results['Hampel alone (before)'];
    const now = results['Hampel + daily/weekly shape (now)'];
    const total = (r: typeof before) => [...r!.found.values()].reduce((a, b) => a + b, 0);
    const strong = (r: typeof before) => factors.filter((f) => f >= 2 || f === 0.5).reduce((sum, f) => sum + r!.found.get(f)!, 0);
    return {
      rows,
      notes: [
        `Clean load: ${load.length} load series of the generated Tallowmere Valley history (fixtures/demo, seed ${data.seed}), ${data.length} hours each, scenario defects removed.`,
        'Sharp mornings: the feeders with +12 % at 07:00 and 08:00 local time every day.',
        `Injected: ${before!.injected} spikes in all (24 per factor per series), at least 48 hours apart; the same scheme, seeded alike, into the real series.`,
        `Real load: ${REAL_LOAD_NAME}, ${real[0]!.values.length} hours; its flags count as false alarms unless they are the source's own jumps.`,
      ],
      checks: [
        {
          name: 'the shape rule raises no more false alarms than Hampel alone, on clean and sharp-morning load',
          passed: now!.clean <= before!.clean && now!.sharpened <= before!.sharpened,
          detail: `clean ${now!.clean} vs ${before!.clean}; sharp mornings ${now!.sharpened} vs ${before!.sharpened}`,
        },
        {
          name: 'the shape rule raises no more flags than Hampel alone on real load',
          passed: now!.real <= before!.real,
          detail: `${now!.real} vs ${before!.real} on ${real[0]!.values.length} real hours`,
        },
        {
          name: 'the shape rule finds at least as many injected spikes as Hampel alone, at every factor',
          passed: factors.every((f) => now!.found.get(f)! >= before!.found.get(f)!),
          detail: `${total(now)} vs ${total(before)} of ${now!.injected}; ×2, ×3 and ÷2: ${strong(now)} vs ${strong(before)}`,
        },
      ],
      data: data_,
    };
  },
};
