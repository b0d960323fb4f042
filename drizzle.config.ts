import { defineConfig } from 'drizzle-kit';

/** `npx drizzle-kit generate` writes SQL migrations for drizzle/schema.ts into drizzle/migrations. */
export default defineConfig({
  dialect: 'postgresql',
  schema: './drizzle/schema.ts',
  out: './drizzle/migrations',
});
