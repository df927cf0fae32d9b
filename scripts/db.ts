/** `npm run db:up` / `npm run db:down`: start or stop the project's PostgreSQL by hand. */
import { defaultLocation, ensurePostgres, stopPostgres } from './postgres';

const command = process.argv[2];
if (command === 'start') {
  const { url, startedHere } = await ensurePostgres();
  console.log(`PostgreSQL ${startedHere ? 'started' : 'already running'}: ${url}`);
} else if (command === 'stop') {
  await stopPostgres(defaultLocation());
  console.log('PostgreSQL stopped.');
} else {
  console.error('Usage: node --import tsx scripts/db.ts start|stop');
  process.exit(2);
}
