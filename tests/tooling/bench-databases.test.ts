import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

import { describe, expect, it } from "vitest";

const scripts = path.resolve(__dirname, "../../scripts");

/**
 * `npm run bench` runs every bench in one cluster, one after another. A bench that seeds a
 * database another bench already filled trips over the rows left there (the room charts once
 * re-inserted readings the ingestion bench had stored, and the whole run stopped on a duplicate
 * key), so each bench makes a database of its own.
 */
describe("the benches' databases", () => {
  it("when every bench script is read, then no two make the same database", () => {
    const owners = new Map<string, string[]>();
    for (const file of readdirSync(scripts).filter((name) => /^bench.*\.ts$/.test(name))) {
      const text = readFileSync(path.join(scripts, file), "utf8");
      for (const match of text.matchAll(/benchDatabase\(\s*cluster,\s*"([^"]+)"/g))
        owners.set(match[1]!, [...(owners.get(match[1]!) ?? []), file]);
    }
    // The committee bench names its database in a constant: found the same way.
    const committee = readFileSync(path.join(scripts, "bench-committee.ts"), "utf8");
    const constant = /const database = "([^"]+)"/.exec(committee)?.[1];
    expect(constant).toBeDefined();
    owners.set(constant!, [...(owners.get(constant!) ?? []), "bench-committee.ts"]);

    expect(owners.size).toBeGreaterThanOrEqual(5);
    const shared = [...owners].filter(([, files]) => files.length > 1);
    expect(shared).toEqual([]);
  });
});
