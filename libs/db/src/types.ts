/** Row types (as read and as inserted) and enum value types inferred from the schema. */
import type {
  adjustmentKind,
  apiTokenScope,
  apiTokens,
  auditLog,
  fits,
  forecastAdjustments,
  forecastPoints,
  forecastState,
  forecastVersions,
  holidayKind,
  holidaySource,
  holidays,
  loginThrottleSubject,
  loginThrottles,
  missComments,
  missEvents,
  missRuleKind,
  missRuleScope,
  missRules,
  missState,
  modelMethod,
  modelSpecs,
  observationRevisions,
  observations,
  oneTimeTokenPurpose,
  oneTimeTokens,
  profileForm,
  organisation,
  refitRunSeries,
  refitRuns,
  refitStatus,
  refitTrigger,
  seasonalTreatment,
  series,
  seriesKind,
  seriesLevel,
  seriesUnit,
  sessions,
  temperatureForecasts,
  timestampsMark,
  uploadContent,
  uploadFindings,
  uploadSource,
  uploadStatus,
  uploads,
  userRole,
  users,
  validationRule,
} from './schema';

/** A row of `organisation` as read. */
export type Organisation = typeof organisation.$inferSelect;
/** A row of `organisation` as inserted (defaults optional). */
export type NewOrganisation = typeof organisation.$inferInsert;
/** A row of `users` as read. */
export type User = typeof users.$inferSelect;
/** A row of `users` as inserted (defaults optional). */
export type NewUser = typeof users.$inferInsert;
/** A row of `sessions` as read. */
export type Session = typeof sessions.$inferSelect;
/** A row of `sessions` as inserted (defaults optional). */
export type NewSession = typeof sessions.$inferInsert;
/** A row of `oneTimeTokens` as read. */
export type OneTimeToken = typeof oneTimeTokens.$inferSelect;
/** A row of `oneTimeTokens` as inserted (defaults optional). */
export type NewOneTimeToken = typeof oneTimeTokens.$inferInsert;
/** A row of `loginThrottles` as read. */
export type LoginThrottle = typeof loginThrottles.$inferSelect;
/** A row of `loginThrottles` as inserted (defaults optional). */
export type NewLoginThrottle = typeof loginThrottles.$inferInsert;
/** A row of `apiTokens` as read. */
export type ApiToken = typeof apiTokens.$inferSelect;
/** A row of `apiTokens` as inserted (defaults optional). */
export type NewApiToken = typeof apiTokens.$inferInsert;
/** A row of `auditLog` as read. */
export type AuditEntry = typeof auditLog.$inferSelect;
/** A row of `auditLog` as inserted (defaults optional). */
export type NewAuditEntry = typeof auditLog.$inferInsert;
/** A row of `series` as read. */
export type Series = typeof series.$inferSelect;
/** A row of `series` as inserted (defaults optional). */
export type NewSeries = typeof series.$inferInsert;
/** A row of `uploads` as read. */
export type Upload = typeof uploads.$inferSelect;
/** A row of `uploads` as inserted (defaults optional). */
export type NewUpload = typeof uploads.$inferInsert;
/** A row of `uploadFindings` as read. */
export type UploadFinding = typeof uploadFindings.$inferSelect;
/** A row of `uploadFindings` as inserted (defaults optional). */
export type NewUploadFinding = typeof uploadFindings.$inferInsert;
/** A row of `observations` as read. */
export type Observation = typeof observations.$inferSelect;
/** A row of `observations` as inserted (defaults optional). */
export type NewObservation = typeof observations.$inferInsert;
/** A row of `observationRevisions` as read. */
export type ObservationRevision = typeof observationRevisions.$inferSelect;
/** A row of `observationRevisions` as inserted (defaults optional). */
export type NewObservationRevision = typeof observationRevisions.$inferInsert;
/** A row of `holidays` as read. */
export type Holiday = typeof holidays.$inferSelect;
/** A row of `holidays` as inserted (defaults optional). */
export type NewHoliday = typeof holidays.$inferInsert;
/** A row of `temperatureForecasts` as read. */
export type TemperatureForecast = typeof temperatureForecasts.$inferSelect;
/** A row of `temperatureForecasts` as inserted (defaults optional). */
export type NewTemperatureForecast = typeof temperatureForecasts.$inferInsert;
/** A row of `modelSpecs` as read. */
export type ModelSpec = typeof modelSpecs.$inferSelect;
/** A row of `modelSpecs` as inserted (defaults optional). */
export type NewModelSpec = typeof modelSpecs.$inferInsert;
/** A row of `fits` as read. */
export type Fit = typeof fits.$inferSelect;
/** A row of `fits` as inserted (defaults optional). */
export type NewFit = typeof fits.$inferInsert;
/** A row of `refitRuns` as read. */
export type RefitRun = typeof refitRuns.$inferSelect;
/** A row of `refitRuns` as inserted (defaults optional). */
export type NewRefitRun = typeof refitRuns.$inferInsert;
/** A row of `refitRunSeries` as read. */
export type RefitRunSeries = typeof refitRunSeries.$inferSelect;
/** A row of `refitRunSeries` as inserted (defaults optional). */
export type NewRefitRunSeries = typeof refitRunSeries.$inferInsert;
/** A row of `forecastVersions` as read. */
export type ForecastVersion = typeof forecastVersions.$inferSelect;
/** A row of `forecastVersions` as inserted (defaults optional). */
export type NewForecastVersion = typeof forecastVersions.$inferInsert;
/** A row of `forecastPoints` as read. */
export type ForecastPoint = typeof forecastPoints.$inferSelect;
/** A row of `forecastPoints` as inserted (defaults optional). */
export type NewForecastPoint = typeof forecastPoints.$inferInsert;
/** A row of `forecastAdjustments` as read. */
export type ForecastAdjustment = typeof forecastAdjustments.$inferSelect;
/** A row of `forecastAdjustments` as inserted (defaults optional). */
export type NewForecastAdjustment = typeof forecastAdjustments.$inferInsert;
/** A row of `missRules` as read. */
export type MissRule = typeof missRules.$inferSelect;
/** A row of `missRules` as inserted (defaults optional). */
export type NewMissRule = typeof missRules.$inferInsert;
/** A row of `missEvents` as read. */
export type MissEvent = typeof missEvents.$inferSelect;
/** A row of `missEvents` as inserted (defaults optional). */
export type NewMissEvent = typeof missEvents.$inferInsert;
/** A row of `missComments` as read. */
export type MissComment = typeof missComments.$inferSelect;
/** A row of `missComments` as inserted (defaults optional). */
export type NewMissComment = typeof missComments.$inferInsert;

/** One value of the `userRole` enum. */
export type UserRole = (typeof userRole.enumValues)[number];
/** One value of the `oneTimeTokenPurpose` enum. */
export type OneTimeTokenPurpose = (typeof oneTimeTokenPurpose.enumValues)[number];
/** One value of the `loginThrottleSubject` enum. */
export type LoginThrottleSubject = (typeof loginThrottleSubject.enumValues)[number];
/** One value of the `apiTokenScope` enum. */
export type ApiTokenScope = (typeof apiTokenScope.enumValues)[number];
/** One value of the `seriesKind` enum. */
export type SeriesKind = (typeof seriesKind.enumValues)[number];
/** One value of the `seriesLevel` enum. */
export type SeriesLevel = (typeof seriesLevel.enumValues)[number];
/** One value of the `seriesUnit` enum. */
export type SeriesUnit = (typeof seriesUnit.enumValues)[number];
/** One value of the `timestampsMark` enum. */
export type TimestampsMark = (typeof timestampsMark.enumValues)[number];
/** One value of the `uploadSource` enum. */
export type UploadSource = (typeof uploadSource.enumValues)[number];
/** One value of the `uploadContent` enum. */
export type UploadContent = (typeof uploadContent.enumValues)[number];
/** One value of the `uploadStatus` enum. */
export type UploadStatus = (typeof uploadStatus.enumValues)[number];
/** One value of the `validationRule` enum. */
export type ValidationRule = (typeof validationRule.enumValues)[number];
/** One value of the `holidayKind` enum. */
export type HolidayKind = (typeof holidayKind.enumValues)[number];
/** One value of the `holidaySource` enum. */
export type HolidaySource = (typeof holidaySource.enumValues)[number];
/** One value of the `modelMethod` enum. */
export type ModelMethod = (typeof modelMethod.enumValues)[number];
/** One value of the `seasonalTreatment` enum. */
export type SeasonalTreatment = (typeof seasonalTreatment.enumValues)[number];
/** One value of the `profileForm` enum. */
export type ProfileForm = (typeof profileForm.enumValues)[number];
/** One value of the `refitTrigger` enum. */
export type RefitTrigger = (typeof refitTrigger.enumValues)[number];
/** One value of the `refitStatus` enum. */
export type RefitStatus = (typeof refitStatus.enumValues)[number];
/** One value of the `forecastState` enum. */
export type ForecastState = (typeof forecastState.enumValues)[number];
/** One value of the `adjustmentKind` enum. */
export type AdjustmentKind = (typeof adjustmentKind.enumValues)[number];
/** One value of the `missRuleKind` enum. */
export type MissRuleKind = (typeof missRuleKind.enumValues)[number];
/** One value of the `missRuleScope` enum. */
export type MissRuleScope = (typeof missRuleScope.enumValues)[number];
/** One value of the `missState` enum. */
export type MissState = (typeof missState.enumValues)[number];
