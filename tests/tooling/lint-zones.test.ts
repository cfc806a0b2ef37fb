import { mkdirSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";

import { ESLint } from "eslint";
import { afterAll, describe, expect, it } from "vitest";

const root = path.resolve(__dirname, "../..");
const probe = path.join(root, "src/features/zz-lint-probe");

describe("the lint rule that keeps client features apart", () => {
  afterAll(() => rmSync(probe, { recursive: true, force: true }));

  it("when a new feature folder imports another feature, then the lint refuses it without any change to the config", async () => {
    mkdirSync(probe, { recursive: true });
    const file = path.join(probe, "probe.ts");
    const code =
      'import { makeMove } from "../actions/api/make-move";\n\nexport const probe = makeMove;\n';
    writeFileSync(file, code);
    // A fresh ESLint reads the config again, which lists the feature folders as they are now.
    const [result] = await new ESLint({ cwd: root }).lintText(code, { filePath: file });
    const messages = result!.messages.map((message) => message.ruleId);
    expect(messages).toContain("import-x/no-restricted-paths");
  });

  it("when a feature imports its own modules, then the rule has nothing to say", async () => {
    const file = path.join(root, "src/features/actions/api/probe.ts");
    const code = 'import { makeMove } from "./make-move";\n\nexport const probe = makeMove;\n';
    const [result] = await new ESLint({ cwd: root }).lintText(code, { filePath: file });
    expect(result!.messages.map((message) => message.ruleId)).not.toContain(
      "import-x/no-restricted-paths",
    );
  });
});
