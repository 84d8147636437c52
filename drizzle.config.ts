import { defineConfig } from "drizzle-kit";

// Migrations are generated with `npm run db:generate` and applied by scripts/ with drizzle-orm's migrator (never `push`).
export default defineConfig({
  dialect: "postgresql",
  schema: "./db/schema.ts",
  out: "./db/migrations",
  strict: true,
});
