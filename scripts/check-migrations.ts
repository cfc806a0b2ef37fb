/**
 * Fails when the Drizzle schema (server/db/schema) has changes no migration in drizzle/ carries.
 * `drizzle-kit check` only checks the migration history against itself, so this runs
 * `drizzle-kit generate` into a scratch copy of drizzle/ and fails if it writes anything.
 */
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

import { handWrittenTables } from "../server/db/partitioned/pressure-readings";

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

/**
 * Tables that drizzle-kit cannot write (a month-partitioned table) are created by hand-written
 * migrations and declared outside the schema drizzle-kit compares: the check skips them by name.
 * It still fails when one is missing its hand-written CREATE, or when the schema that drizzle-kit
 * compares declares one (drizzle-kit would then write a plain, unpartitioned table over it).
 */
export function handWrittenProblems({
  migrations = "drizzle",
  tables = handWrittenTables as readonly string[],
}: { migrations?: string; tables?: readonly string[] } = {}): string[] {
  const folder = path.join(root, migrations);
  const texts = filesUnder(folder)
    .filter((file) => file.endsWith(".sql"))
    .map((file) => readFileSync(path.join(folder, file), "utf8"));
  const problems: string[] = [];
  for (const table of tables) {
    const creates = texts.filter((text) => text.includes(`CREATE TABLE "${table}"`));
    if (creates.length === 0)
      problems.push(`No migration in ${migrations}/ creates the hand-written table ${table}.`);
    else if (!creates.some((text) => /PARTITION BY/i.test(text)))
      problems.push(`${table} is created without its partitioning: only drizzle-kit wrote it.`);
  }
  return problems;
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
  const handWritten = handWrittenProblems();
  if (handWritten.length > 0) {
    for (const problem of handWritten) console.error(problem);
    process.exit(1);
  }
  console.log(
    `Migrations match the schema (hand-written and skipped by name: ${handWrittenTables.join(", ")}).`,
  );
}
