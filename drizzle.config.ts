import { defineConfig } from "drizzle-kit";

// Used only by `npm run db:generate`; the app applies migrations itself at start-up.
export default defineConfig({
  dialect: "postgresql",
  schema: "./server/db/schema/index.ts",
  out: "./drizzle",
  strict: true,
  verbose: true,
  dbCredentials: {
    url: process.env.DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/lintel",
  },
});
