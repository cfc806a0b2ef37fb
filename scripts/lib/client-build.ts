import { fileURLToPath } from "node:url";

import { build } from "vite";

export const projectRoot = fileURLToPath(new URL("../..", import.meta.url));

/** Builds the client with the project's vite config into `outDir`. */
export async function buildClient(outDir: string): Promise<void> {
  await build({
    root: projectRoot,
    configFile: `${projectRoot}/vite.config.ts`,
    logLevel: "warn",
    build: { outDir, emptyOutDir: true },
  });
}
