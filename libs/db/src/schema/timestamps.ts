import { timestamp } from 'drizzle-orm/pg-core';

/** A point in time stored as timestamptz and read as a JavaScript Date. */
export const instant = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' });

/** When the row was created; the database fills it in. */
export const createdAt = () => instant('created_at').notNull().defaultNow();

/** When the row last changed; the database fills it on insert and writers set it on update. */
export const updatedAt = () =>
  instant('updated_at')
    .notNull()
    .defaultNow()
    .$onUpdate(() => new Date());
