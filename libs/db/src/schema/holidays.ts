import { date, index, integer, pgEnum, pgTable, text, unique } from 'drizzle-orm/pg-core';
import { users } from './people';
import { createdAt, updatedAt } from './timestamps';

/** Kind of day off, following the `date-holidays` package's types plus the utility's own days. */
export const holidayKind = pgEnum('holiday_kind', ['public', 'bank', 'school', 'optional', 'observance', 'company']);

/** Where a calendar entry came from: seeded from the holiday package, or entered by a planner. */
export const holidaySource = pgEnum('holiday_source', ['package', 'manual']);

/** The organisation's holiday calendar, which feeds the day-type regressors. */
export const holidays = pgTable(
  'holidays',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    day: date('day', { mode: 'string' }).notNull(),
    name: text('name').notNull(),
    kind: holidayKind('kind').notNull().default('public'),
    source: holidaySource('source').notNull().default('manual'),
    updatedById: integer('updated_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [unique('holidays_day_name_key').on(t.day, t.name), index('holidays_day_idx').on(t.day)],
);
