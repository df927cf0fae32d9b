/** Seeding of the demo cooperative. */
export { seedDemo, type SeedDemoOptions, type SeedDemoResult } from './seed-demo';
export { insertObservations, defaultBatchRows, type SeriesReadings } from './insert-observations';
