/**
 * Fails when the Drizzle schema (server/db/schema) has changes no migration in drizzle/ carries.
 * `drizzle-kit check` only checks the migration history against itself, so this runs
 * `drizzle-kit generate` into a scratch copy of drizzle/ and fails if it writes anything.
 */
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

import { run } from "./lib/process";

const root = path.resolve(import.meta.dirname, "..");

function filesUnder(folder: string): string[] {
  return readdirSync(folder, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => path.relative(folder, path.join(entry.parentPath, entry.name)))
    .sort();
}

/**
 * The migrations drizzle-kit would write for the schema as it is; empty when it is up to date.
 * Both paths are inside the repository (drizzle-kit resolves the schema's imports from there).
 */
export function pendingMigrations({
  schema = "server/db/schema/index.ts",
  migrations = "drizzle",
}: { schema?: string; migrations?: string } = {}): { file: string; text: string }[] {
  const scratch = mkdtempSync(path.join(tmpdir(), "lintel-migrations-"));
  try {
    const copy = path.join(scratch, "drizzle");
    cpSync(path.join(root, migrations), copy, { recursive: true });
    const before = new Set(filesUnder(copy));
    // drizzle-kit prefixes the out folder with "./", so it is given relative to the repository.
    run(
      "npx",
      [
        "drizzle-kit",
        "generate",
        "--dialect",
        "postgresql",
        "--schema",
        `./${schema}`,
        "--out",
        path.relative(root, copy),
      ],
      { cwd: root },
    );
    return filesUnder(copy)
      .filter((file) => !before.has(file) && file.endsWith(".sql"))
      .map((file) => ({ file, text: readFileSync(path.join(copy, file), "utf8") }));
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

if (process.argv[1] && import.meta.filename === path.resolve(process.argv[1])) {
  const pending = pendingMigrations();
  if (pending.length > 0) {
    console.error(
      "The schema in server/db/schema has changes that no migration in drizzle/ carries. Run `npm run db:generate` and commit the migration. drizzle-kit would write:",
    );
    for (const { file, text } of pending) console.error(`\n-- ${file}\n${text}`);
    process.exit(1);
  }
  console.log("Migrations match the schema.");
}
