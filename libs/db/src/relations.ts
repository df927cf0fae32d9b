/**
 * Relations for Drizzle's relational query API (`db.query.series.findFirst({ with: … })`).
 * They describe joins only; the foreign keys themselves live in the schema.
 */
import { relations } from 'drizzle-orm';
import { apiTokens } from './schema/api-tokens';
import { auditLog } from './schema/audit';
import { forecastAdjustments, forecastPoints, forecastVersions } from './schema/forecasts';
import { missComments, missEvents, missRules } from './schema/misses';
import { fits, modelSpecs } from './schema/models';
import { observations } from './schema/observations';
import { users } from './schema/people';
import { refitRunSeries, refitRuns } from './schema/refits';
import { series } from './schema/series';
import { sessions } from './schema/sign-in';
import { temperatureForecasts } from './schema/temperature-forecasts';
import { uploadFindings, uploads } from './schema/uploads';

/** A person's sessions and the tokens they created. */
export const usersRelations = relations(users, ({ many }) => ({
  sessions: many(sessions),
  apiTokens: many(apiTokens),
}));

/** The person a session belongs to. */
export const sessionsRelations = relations(sessions, ({ one }) => ({
  user: one(users, { fields: [sessions.userId], references: [users.id] }),
}));

/** The person who created a token. */
export const apiTokensRelations = relations(apiTokens, ({ one }) => ({
  createdBy: one(users, { fields: [apiTokens.createdById], references: [users.id] }),
}));

/** The actor of an audit entry. */
export const auditLogRelations = relations(auditLog, ({ one }) => ({
  actorUser: one(users, { fields: [auditLog.actorUserId], references: [users.id] }),
  actorToken: one(apiTokens, { fields: [auditLog.actorTokenId], references: [apiTokens.id] }),
}));

/** A series' place in the hierarchy, its temperature station, settings, fits and versions. */
export const seriesRelations = relations(series, ({ one, many }) => ({
  parent: one(series, { fields: [series.parentId], references: [series.id], relationName: 'hierarchy' }),
  children: many(series, { relationName: 'hierarchy' }),
  temperatureSeries: one(series, {
    fields: [series.temperatureSeriesId],
    references: [series.id],
    relationName: 'temperature',
  }),
  loadSeries: many(series, { relationName: 'temperature' }),
  modelSpec: one(modelSpecs, { fields: [series.id], references: [modelSpecs.seriesId] }),
  fits: many(fits),
  forecastVersions: many(forecastVersions),
}));

/** The uploader and the findings of an upload. */
export const uploadsRelations = relations(uploads, ({ one, many }) => ({
  uploadedBy: one(users, { fields: [uploads.uploadedById], references: [users.id] }),
  findings: many(uploadFindings),
}));

/** The upload and series a finding belongs to. */
export const uploadFindingsRelations = relations(uploadFindings, ({ one }) => ({
  upload: one(uploads, { fields: [uploadFindings.uploadId], references: [uploads.id] }),
  series: one(series, { fields: [uploadFindings.seriesId], references: [series.id] }),
}));

/** The series and upload of a reading. */
export const observationsRelations = relations(observations, ({ one }) => ({
  series: one(series, { fields: [observations.seriesId], references: [series.id] }),
  upload: one(uploads, { fields: [observations.uploadId], references: [uploads.id] }),
}));

/** The series a model setting belongs to. */
export const modelSpecsRelations = relations(modelSpecs, ({ one }) => ({
  series: one(series, { fields: [modelSpecs.seriesId], references: [series.id] }),
}));

/** The series of a fit and the versions forecast from it. */
export const fitsRelations = relations(fits, ({ one, many }) => ({
  series: one(series, { fields: [fits.seriesId], references: [series.id] }),
  versions: many(forecastVersions),
}));

/** A version's series, fit, run, points, adjustments and misses. */
export const forecastVersionsRelations = relations(forecastVersions, ({ one, many }) => ({
  series: one(series, { fields: [forecastVersions.seriesId], references: [series.id] }),
  fit: one(fits, { fields: [forecastVersions.fitId], references: [fits.id] }),
  refitRun: one(refitRuns, { fields: [forecastVersions.refitRunId], references: [refitRuns.id] }),
  approvedBy: one(users, { fields: [forecastVersions.approvedById], references: [users.id] }),
  points: many(forecastPoints),
  adjustments: many(forecastAdjustments),
  missEvents: many(missEvents),
}));

/** The version a point belongs to. */
export const forecastPointsRelations = relations(forecastPoints, ({ one }) => ({
  version: one(forecastVersions, { fields: [forecastPoints.versionId], references: [forecastVersions.id] }),
}));

/** The version an adjustment changes and who made it. */
export const forecastAdjustmentsRelations = relations(forecastAdjustments, ({ one }) => ({
  version: one(forecastVersions, { fields: [forecastAdjustments.versionId], references: [forecastVersions.id] }),
  createdBy: one(users, { fields: [forecastAdjustments.createdById], references: [users.id] }),
}));

/** A run's requester and per-series progress. */
export const refitRunsRelations = relations(refitRuns, ({ one, many }) => ({
  requestedBy: one(users, { fields: [refitRuns.requestedById], references: [users.id] }),
  series: many(refitRunSeries),
  versions: many(forecastVersions),
}));

/** The run, series and fit of one per-series refit. */
export const refitRunSeriesRelations = relations(refitRunSeries, ({ one }) => ({
  run: one(refitRuns, { fields: [refitRunSeries.runId], references: [refitRuns.id] }),
  series: one(series, { fields: [refitRunSeries.seriesId], references: [series.id] }),
  fit: one(fits, { fields: [refitRunSeries.fitId], references: [fits.id] }),
}));

/** A rule's watched series and the misses it found. */
export const missRulesRelations = relations(missRules, ({ one, many }) => ({
  scopeSeries: one(series, { fields: [missRules.scopeSeriesId], references: [series.id] }),
  events: many(missEvents),
}));

/** A miss's rule, series, version and comments. */
export const missEventsRelations = relations(missEvents, ({ one, many }) => ({
  rule: one(missRules, { fields: [missEvents.ruleId], references: [missRules.id] }),
  series: one(series, { fields: [missEvents.seriesId], references: [series.id] }),
  version: one(forecastVersions, { fields: [missEvents.versionId], references: [forecastVersions.id] }),
  comments: many(missComments),
}));

/** The miss a comment is on and its author. */
export const missCommentsRelations = relations(missComments, ({ one }) => ({
  event: one(missEvents, { fields: [missComments.eventId], references: [missEvents.id] }),
  author: one(users, { fields: [missComments.authorId], references: [users.id] }),
}));

/** The station and upload of a temperature forecast value. */
export const temperatureForecastsRelations = relations(temperatureForecasts, ({ one }) => ({
  series: one(series, { fields: [temperatureForecasts.seriesId], references: [series.id] }),
  upload: one(uploads, { fields: [temperatureForecasts.uploadId], references: [uploads.id] }),
}));
