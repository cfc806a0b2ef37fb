import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";

import { afterAll, describe, expect, it } from "vitest";

import { handWrittenProblems, pendingMigrations } from "../../scripts/check-migrations";

const root = path.resolve(__dirname, "../..");
mkdirSync(path.join(root, ".test-data"), { recursive: true });
const scratch = mkdtempSync(path.join(root, ".test-data", "drift-"));

describe("the migration drift check", () => {
  afterAll(() => rmSync(scratch, { recursive: true, force: true }));

  it("when the schema matches drizzle/, then no migration is pending", () => {
    expect(pendingMigrations()).toEqual([]);
  });

  it("when a schema has a table no migration creates, then the check finds the migration it would need", () => {
    const schema = path.join(scratch, "schema.ts");
    writeFileSync(
      schema,
      'import { pgTable, uuid } from "drizzle-orm/pg-core";\n\nexport const probes = pgTable("drift_probes", { id: uuid("id").primaryKey() });\n',
    );
    const migrations = path.join(scratch, "migrations");
    mkdirSync(migrations);
    const pending = pendingMigrations({
      schema: path.relative(root, schema),
      migrations: path.relative(root, migrations),
    });
    expect(pending).toHaveLength(1);
    expect(pending[0]!.text).toContain('CREATE TABLE "drift_probes"');
  });

  it("when the hand-written partitioned readings table has its migration, then the check has nothing to say about it", () => {
    expect(handWrittenProblems()).toEqual([]);
  });

  it("when a hand-written table's migration is missing or was written by drizzle-kit, then the check names it", () => {
    const migrations = path.join(scratch, "hand-written");
    mkdirSync(migrations);
    writeFileSync(
      path.join(migrations, "0000_plain.sql"),
      'CREATE TABLE "plain_readings" ("id" uuid);\n',
    );
    expect(
      handWrittenProblems({
        migrations: path.relative(root, migrations),
        tables: ["plain_readings", "absent_readings"],
      }),
    ).toEqual([
      "plain_readings is created without its partitioning: only drizzle-kit wrote it.",
      `No migration in ${path.relative(root, migrations)}/ creates the hand-written table absent_readings.`,
    ]);
  });
});
