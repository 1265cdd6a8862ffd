import { defineConfig } from 'drizzle-kit';

// Migrations are generated from the schema (`npm run db:generate`) and
// applied at start-up; never edit one that has landed.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema/index.ts',
  out: './drizzle',
  casing: 'snake_case',
});
