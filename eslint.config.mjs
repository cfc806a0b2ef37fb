import { readdirSync } from "node:fs";

import js from "@eslint/js";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";
import importX from "eslint-plugin-import-x";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

// Import direction (see DEVELOPERS.md): shared ← server, shared ← client; client features never
// import each other or the app layer; nothing imports scripts except scripts and tests.
// Every folder under src/features is a feature, so a new one is covered without editing this file.
const features = readdirSync(new URL("./src/features", import.meta.url), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);

export default tseslint.config(
  {
    ignores: [
      "dist/**",
      "node_modules/**",
      ".data/**",
      ".test-data/**",
      "drizzle/**",
      "coverage/**",
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    plugins: { "import-x": importX },
    settings: {
      "import-x/resolver-next": [
        createTypeScriptImportResolver({
          project: ["./tsconfig.json", "./tsconfig.app.json"],
          noWarnOnMultipleProjects: true,
        }),
      ],
    },
    languageOptions: { globals: { ...globals.node } },
    rules: {
      "import-x/no-cycle": ["error", { ignoreExternal: true }],
      "import-x/no-restricted-paths": [
        "error",
        {
          zones: [
            {
              target: "./shared",
              from: "./src",
              message: "shared/ must not depend on the client.",
            },
            {
              target: "./shared",
              from: "./server",
              message: "shared/ must not depend on the server.",
            },
            {
              target: "./src",
              from: "./server",
              message: "The client must not import server code.",
            },
            {
              target: "./server",
              from: "./src",
              message: "The server must not import client code.",
            },
            {
              target: "./server",
              from: "./scripts",
              message: "The server must not import provisioning scripts.",
            },
            {
              target: "./src/features",
              from: "./src/app",
              message: "Features must not import the app layer.",
            },
            {
              target: "./src/components",
              from: "./src/features",
              message: "Shared components must not import features.",
            },
            {
              target: "./src/lib",
              from: "./src/features",
              message: "lib/ must not import features.",
            },
            ...features.map((feature) => ({
              target: `./src/features/${feature}`,
              from: "./src/features",
              except: [`./${feature}`],
              message: "Features must not import each other; compose them in src/app.",
            })),
          ],
        },
      ],
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_" },
      ],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
      "no-restricted-properties": [
        "error",
        {
          object: "process",
          property: "env",
          message: "Read configuration in server/env.ts only.",
        },
      ],
    },
  },
  {
    // Request text goes through `text()` in shared/schemas/common.ts, which refuses characters the
    // database cannot store; a bare string schema would let them through to a 500.
    files: ["shared/schemas/**/*.ts", "server/modules/**/*.ts"],
    // shell.ts holds replies only (read by the app shell with the small build of zod).
    ignores: ["shared/schemas/common.ts", "shared/schemas/shell.ts"],
    rules: {
      "no-restricted-syntax": [
        "error",
        {
          selector: "MemberExpression[object.name='z'][property.name='string']",
          message:
            "Use text() or requiredText() for request text, responseText() for responses (shared/schemas/common.ts).",
        },
        {
          selector:
            "MemberExpression[object.object.name='z'][object.property.name='coerce'][property.name='string']",
          message: "Use text() from shared/schemas/common.ts for request text.",
        },
      ],
    },
  },
  {
    // Services, repositories and jobs take plain values (AppDeps, SignedIn, an actor; see
    // server/lib/context.ts), never HTTP types: routers and middleware are the only HTTP side.
    files: ["server/modules/**/*.ts", "server/lib/**/*.ts", "server/outbox/**/*.ts"],
    ignores: ["server/modules/**/*.router.ts", "server/lib/routes.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          paths: [{ name: "express", message: "Only routers and middleware handle requests." }],
          patterns: [
            {
              group: ["**/lib/routes", "**/middleware/*"],
              message:
                "Services take plain values: import AppDeps and SignedIn from server/lib/context.ts.",
            },
          ],
        },
      ],
    },
  },
  {
    files: ["scripts/**", "tests/**", "server/env.ts", "*.config.ts", "*.config.mjs"],
    rules: { "no-restricted-properties": "off" },
  },
  {
    // The CSV parser needs Node's Buffer: CSV uploads are read on the server only.
    files: ["src/**/*.{ts,tsx}"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          paths: [{ name: "csv-parse/sync", message: "CSV is parsed on the server." }],
          patterns: [
            {
              group: ["**/schemas/pressure-readings-csv"],
              message: "CSV is parsed on the server; the client uses pressure-readings.ts.",
            },
          ],
        },
      ],
    },
  },
  {
    files: ["src/**/*.{ts,tsx}", "tests/client/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    languageOptions: { globals: { ...globals.browser } },
    rules: { ...reactHooks.configs.recommended.rules },
  },
);
