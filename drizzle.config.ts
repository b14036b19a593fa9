import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'sqlite',
  schema: './server/db/schema.ts',
  out: './drizzle',
  dbCredentials: { url: process.env.SYCONIUM_DB ?? 'data/syconium.db' },
});
