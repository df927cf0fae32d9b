/**
 * Settings trials: a planner's proposed model settings backtested against the series' current settings
 * from the same rolling origins, before applying them. Read with data.read; started and applied with
 * models.edit.
 */
import { z } from 'zod';
import { modelSettingsFieldsSchema, type ModelSettingsRequest } from './models';

/** Daily forecast origins of every trial (two weeks, so each weekday is scored twice). */
export const TRIAL_ORIGINS = 14;
/** The two horizons a trial scores: day-ahead (the first 24 hours) and week-ahead (all 168). */
export const trialHorizons = { dayAhead: 24, weekAhead: 168 } as const;
/** Hours of history before the first origin that a trial needs at least (four weeks of the weekly cycle). */
export const TRIAL_MIN_TRAINING_HOURS = 672;

/** A trial is queued, running, then finished or failed (with the reason). */
export const settingsTrialStates = ['queued', 'running', 'finished', 'failed'] as const;
/** One of settingsTrialStates. */
export type SettingsTrialState = (typeof settingsTrialStates)[number];

/** Scores of one side at one horizon, over every origin. */
export const trialScoresSchema = z.object({
  /** Forecast hours scored (origins × horizon). */
  hours: z.number().int(),
  mae: z.number(),
  rmse: z.number(),
  /** Percent; null when some actual was zero. */
  mape: z.number().nullable(),
  /** MAE scaled by the in-sample seasonal-naive (same hour last week) MAE at each origin; null when that is zero. */
  mase: z.number().nullable(),
  /** Share of actual hours inside the 80 % and 95 % bands, percent. */
  coverage80: z.number(),
  coverage95: z.number(),
  /** Whole local days scored for the daily peak. */
  peakDays: z.number().int(),
  /** Mean |forecast daily peak − actual daily peak|, in the series' unit. */
  peakError: z.number().nullable(),
  /** Mean |forecast peak hour − actual peak hour|, hours. */
  peakHourError: z.number().nullable(),
  /** The seasonal-naive benchmark on the same hours. */
  naive: z.object({ mae: z.number(), mase: z.number().nullable() }),
});
/** See trialScoresSchema. */
export type TrialScores = z.infer<typeof trialScoresSchema>;

/** What one side (current or proposed settings) scored, and what its refits chose at the origins. */
export const trialSideSchema = z.object({
  dayAhead: trialScoresSchema,
  weekAhead: trialScoresSchema,
  /** The model fitted at each origin, counted (e.g. { "AR by least squares": 14 }). */
  fitted: z.record(z.string(), z.number().int()),
  /** Whether temperatures were used, and why not when they were not. */
  temperature: z.object({ used: z.boolean(), reason: z.string() }),
});
/** See trialSideSchema. */
export type TrialSide = z.infer<typeof trialSideSchema>;

/** A trial's results: both sides from identical origins. */
export const trialResultsSchema = z.object({
  current: trialSideSchema,
  proposed: trialSideSchema,
});
/** See trialResultsSchema. */
export type TrialResults = z.infer<typeof trialResultsSchema>;

/** One trial as the API shows it. */
export const settingsTrialSchema = z.object({
  id: z.number().int(),
  seriesId: z.number().int(),
  state: z.enum(settingsTrialStates),
  /** The settings in force when the trial started, and the proposal. */
  currentSettings: modelSettingsFieldsSchema,
  proposedSettings: modelSettingsFieldsSchema,
  /** Refits done of all the trial needs (two sides × origins), for the progress bar. */
  progress: z.object({ done: z.number().int(), total: z.number().int() }),
  /** The first and last forecast origin (set once the history is read). */
  firstOrigin: z.iso.datetime().nullable(),
  lastOrigin: z.iso.datetime().nullable(),
  results: trialResultsSchema.nullable(),
  /** Why a failed trial failed, in words. */
  error: z.string().nullable(),
  requestedBy: z.string().nullable(),
  createdAt: z.iso.datetime(),
  startedAt: z.iso.datetime().nullable(),
  finishedAt: z.iso.datetime().nullable(),
  appliedAt: z.iso.datetime().nullable(),
  appliedBy: z.string().nullable(),
});
/** See settingsTrialSchema. */
export type SettingsTrial = z.infer<typeof settingsTrialSchema>;

/** GET /api/series/:id/settings-trials: newest first. */
export const settingsTrialListSchema = z.object({ trials: z.array(settingsTrialSchema) });
/** See settingsTrialListSchema. */
export type SettingsTrialList = z.infer<typeof settingsTrialListSchema>;

/** POST /api/settings-trials/:id/apply. */
export const applySettingsTrialRequestSchema = z.object({
  /** Queue a refit of the series with the new settings at once (otherwise they apply from the next nightly refit). */
  refit: z.boolean().default(true),
});
/** See applySettingsTrialRequestSchema. */
export type ApplySettingsTrialRequest = z.infer<typeof applySettingsTrialRequestSchema>;

/** What applying a trial did. */
export const applySettingsTrialResultSchema = z.object({
  trial: settingsTrialSchema,
  /** The refit run queued with the new settings, if any. */
  refitRunId: z.number().int().nullable(),
});
/** See applySettingsTrialResultSchema. */
export type ApplySettingsTrialResult = z.infer<typeof applySettingsTrialResultSchema>;

/** True when two sets of model settings are the same, whatever order their keys come in (stored JSON reorders them). */
export function sameModelSettings(a: ModelSettingsRequest, b: ModelSettingsRequest): boolean {
  return canonicalJson(a) === canonicalJson(b);
}

/** JSON with object keys sorted at every level. */
function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${canonicalJson(item)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}
