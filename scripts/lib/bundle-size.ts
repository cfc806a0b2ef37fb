import { existsSync, readFileSync } from "node:fs";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { gzipSync } from "node:zlib";

import { buildClient } from "./client-build";

interface ManifestChunk {
  file: string;
  imports?: string[];
  dynamicImports?: string[];
  isEntry?: boolean;
}

/**
 * Builds the client into a temp folder and reports the gzip size of the JavaScript a screen needs
 * before it can show: the entry with its static imports, plus the screen's own route chunk.
 */
export async function clientBundleReport(): Promise<string[]> {
  const outDir = mkdtempSync(path.join(os.tmpdir(), "lintel-bundle-"));
  try {
    await buildClient(outDir);
    const manifestPath = path.join(outDir, ".vite", "manifest.json");
    if (!existsSync(manifestPath)) return ["(no build manifest)"];
    const manifest = JSON.parse(readFileSync(manifestPath, "utf8")) as Record<
      string,
      ManifestChunk
    >;
    const gz = (file: string) => gzipSync(readFileSync(path.join(outDir, file))).length;
    const closure = (keys: string[], seen = new Set<string>()): Set<string> => {
      for (const key of keys) {
        if (seen.has(key) || !manifest[key]) continue;
        seen.add(key);
        closure(manifest[key]!.imports ?? [], seen);
      }
      return seen;
    };
    const entry = Object.keys(manifest).find((key) => manifest[key]!.isEntry)!;
    const size = (keys: Set<string>) =>
      [...keys].reduce((sum, key) => sum + gz(manifest[key]!.file), 0);
    const lines = [
      `shell (entry and its imports): ${(size(closure([entry])) / 1024).toFixed(1)} KB`,
    ];
    for (const [label, pattern] of [
      ["audit screen", /routes\/audit\.tsx$/],
      ["sign-in", /routes\/sign-in\.tsx$/],
      ["floor map", /floor-map\.tsx$/],
    ] as const) {
      const key = Object.keys(manifest).find((candidate) => pattern.test(candidate));
      if (!key) continue;
      lines.push(
        `${label} (shell + its chunks): ${(size(closure([entry, key])) / 1024).toFixed(1)} KB${label === "audit screen" ? " (target ≤ 200 KB)" : ""}`,
      );
    }
    return lines;
  } finally {
    rmSync(outDir, { recursive: true, force: true });
  }
}
