import { sql } from 'drizzle-orm';
import { boolean, check, jsonb, pgTable, smallint, text } from 'drizzle-orm/pg-core';
import { createdAt, updatedAt } from './timestamps';

/** Defaults applied to new miss rules and alert e-mails unless a rule says otherwise. */
export interface AlertDefaults {
  /** Addresses e-mailed when a miss is detected and a rule names no recipients. */
  recipients: string[];
  /** Interval level (percent) whose band the "outside band" rule checks. */
  bandLevel: number;
  /** Absolute percentage error above which "error over threshold" fires. */
  errorThresholdPercent: number;
  /** Minutes to wait before e-mailing again about the same open miss. */
  repeatAfterMinutes: number;
}

/**
 * The utility running this Loadwright installation: exactly one row, keyed by a constant `true`
 * so a second row cannot be inserted.
 */
export const organisation = pgTable(
  'organisation',
  {
    singleton: boolean('singleton').primaryKey().default(true),
    name: text('name').notNull(),
    timeZone: text('time_zone').notNull().default('UTC'),
    refitHour: smallint('refit_hour').notNull().default(2),
    /** Minutes after local midnight by which each day's forecasts must be written (07:00 by default). */
    forecastDeadlineMinute: smallint('forecast_deadline_minute').notNull().default(420),
    /** Local hour at which the daily digest of misses is e-mailed. */
    digestHour: smallint('digest_hour').notNull().default(7),
    holidayCountry: text('holiday_country'),
    holidayRegion: text('holiday_region'),
    alertDefaults: jsonb('alert_defaults')
      .$type<AlertDefaults>()
      .notNull()
      .default({ recipients: [], bandLevel: 95, errorThresholdPercent: 10, repeatAfterMinutes: 240 }),
    mailFrom: text('mail_from').notNull().default('Loadwright <loadwright@localhost>'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    check('organisation_singleton_check', sql`${t.singleton}`),
    check('organisation_refit_hour_check', sql`${t.refitHour} between 0 and 23`),
    check('organisation_forecast_deadline_check', sql`${t.forecastDeadlineMinute} between 0 and 1439`),
    check('organisation_digest_hour_check', sql`${t.digestHour} between 0 and 23`),
  ],
);
