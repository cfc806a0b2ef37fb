import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";

import { afterAll, describe, expect, it } from "vitest";

import { pendingMigrations } from "../../scripts/check-migrations";

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
});
