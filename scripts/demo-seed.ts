/** Seeds the demo cooperative into an empty database and describes its accounts for the console. */
import { demoScenario } from '../fixtures/demo/scenario';
import { seedDemo } from '../libs/db/src/seed/seed-demo';

/** Seeds when the database holds no organisation yet; true when it seeded. */
export async function seedDemoIfEmpty(databaseUrl: string): Promise<boolean> {
  const { seeded } = await seedDemo(databaseUrl);
  return seeded;
}

/** The demo sign-ins, one line per role, for the start banner and the README. */
export function demoAccountsText(): string {
  const width = Math.max(...demoScenario.accounts.map((a) => a.email.length));
  const lines = demoScenario.accounts.map((a) => `  ${a.role.padEnd(8)} ${a.email.padEnd(width)}  (${a.displayName})`);
  return `Demo utility: ${demoScenario.organisation.name}\nDemo accounts (password for all: ${demoScenario.demoPassword}):\n${lines.join('\n')}\n`;
}
