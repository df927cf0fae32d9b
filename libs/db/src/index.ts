/** Loadwright's database: schema, row types, connection and migrations. */
export * from './schema';
export * from './relations';
export * from './types';
export { createDb, schema, type CreateDbOptions, type Database, type DbHandle } from './client';
export { migrate, migrationsFolder } from './migrate';
export { isDatabaseUnavailable } from './connection-errors';
export { insertJobs } from './job-insert';
export { ensurePerSeriesQueues, ensureQueue, enqueuePerSeries, perSeriesQueueOptions, type QueueOptions } from './job-queues';
