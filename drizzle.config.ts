import { defineConfig } from 'drizzle-kit';

// Only `drizzle-kit generate` is used: it diffs the schema against migrations/ and needs no database.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema.ts',
  out: './migrations',
});
