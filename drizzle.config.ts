import { defineConfig } from 'drizzle-kit';

/** Migrations are generated from the schema with `npx drizzle-kit generate` and applied by `migrate()`. */
export default defineConfig({
  dialect: 'postgresql',
  schema: './libs/db/src/schema',
  out: './drizzle',
  strict: true,
  verbose: true,
});
