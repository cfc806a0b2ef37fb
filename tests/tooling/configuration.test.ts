import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

import { describe, expect, it } from "vitest";

import { settingNames } from "../../server/env";

const root = path.resolve(__dirname, "../..");

/** The variables named in the first column of the README's configuration tables. */
function documentedVariables(): Set<string> {
  const readme = readFileSync(path.join(root, "README.md"), "utf8");
  const start = readme.indexOf("## Configuration for a real deployment");
  const end = readme.indexOf("\n## ", start + 1);
  expect(start).toBeGreaterThan(-1);
  const names = new Set<string>();
  for (const line of readme.slice(start, end).split("\n")) {
    const firstCell = /^\|([^|]*)\|/.exec(line)?.[1] ?? "";
    for (const match of firstCell.matchAll(/`([A-Z][A-Z0-9_]+)`/g)) names.add(match[1]!);
  }
  return names;
}

function sourceFiles(folder: string): string[] {
  return readdirSync(path.join(root, folder), { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile() && entry.name.endsWith(".ts"))
    .map((entry) => path.join(entry.parentPath, entry.name));
}

/** Variables the scripts and the server read straight from process.env (not ones they set). */
function variablesReadOutsideTheParser(): Set<string> {
  const names = new Set<string>();
  for (const file of [...sourceFiles("scripts"), ...sourceFiles("server")]) {
    const text = readFileSync(file, "utf8");
    for (const match of text.matchAll(/process\.env\.([A-Z][A-Z0-9_]+)(\s*(\?\?=|=(?!=)))?/g)) {
      if (!match[2]) names.add(match[1]!);
    }
  }
  return names;
}

describe("the README's configuration tables", () => {
  it("when the settings parser reads a variable, then the README's table names it", () => {
    const documented = documentedVariables();
    expect(settingNames.length).toBeGreaterThan(20);
    expect(settingNames.filter((name) => !documented.has(name))).toEqual([]);
  });

  it("when a script or the server reads a variable straight from the environment, then the README names it", () => {
    const documented = documentedVariables();
    const read = [...variablesReadOutsideTheParser()];
    expect(read).toContain("LINTEL_PG_PORT");
    expect(read.filter((name) => !documented.has(name))).toEqual([]);
  });

  it("when the README names a variable, then something reads it", () => {
    const read = new Set([...settingNames, ...variablesReadOutsideTheParser()]);
    expect([...documentedVariables()].filter((name) => !read.has(name))).toEqual([]);
  });
});
