/**
 * `npm run seed`: seeds the demo cooperative into the project's database (started on loopback unless
 * DATABASE_URL names a server), migrating it first. Does nothing when an organisation already exists.
 */
import { migrate } from '@loadwright/db';
import { demoScenario } from '../fixtures/demo/scenario';
import { seedDemo } from '../libs/db/src/seed/seed-demo';
import { addDemoAccuracy, addDemoMisses } from './demo-seed';
import { defaultLocation, ensurePostgres, stopPostgres } from './postgres';

const database = await ensurePostgres();
try {
  await migrate(database.url);
  const result = await seedDemo(database.url);
  if (!result.seeded) {
    console.log('The database already holds an organisation: nothing seeded.');
  } else {
    const { generateMs, hashMs, writeMs } = result.timings;
    const misses = await addDemoMisses(database.url);
    const scored = await addDemoAccuracy(database.url);
    console.log(
      `Seeded ${demoScenario.organisation.name}: ${result.observations.toLocaleString('en-US')} readings, ${misses} misses, ${scored} forecast hours scored.`,
    );
    console.log(
      `  generated in ${generateMs.toFixed(0)} ms, passwords hashed in ${hashMs.toFixed(0)} ms, written in ${writeMs.toFixed(0)} ms`,
    );
  }
} finally {
  // Leave the server as we found it: stop it only if this command started it.
  if (database.startedHere) await stopPostgres(defaultLocation());
}
