import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'mysql',
  schema: './server/db/schema/index.ts',
  out: './drizzle/migrations',
  casing: 'snake_case',
});
