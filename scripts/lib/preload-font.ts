import type { Plugin } from "vite";

/**
 * Adds `<link rel="preload" as="font">` for the built font file whose name matches `file`, so the
 * phone asks for the body text's font with the page's first files instead of once the styles are
 * applied. Only one weight: the others arrive as the text that uses them appears.
 */
export function preloadFont(file: RegExp): Plugin {
  return {
    name: "lintel-preload-font",
    apply: "build",
    transformIndexHtml: {
      order: "post",
      handler(_html, context) {
        const font = Object.values(context.bundle ?? {}).find(
          (output) => output.type === "asset" && file.test(output.fileName),
        );
        if (!font) throw new Error(`No built font file matches ${file}: nothing to preload.`);
        return [
          {
            tag: "link",
            attrs: {
              rel: "preload",
              as: "font",
              type: "font/woff2",
              href: `/${font.fileName}`,
              crossorigin: "",
            },
            injectTo: "head",
          },
        ];
      },
    },
  };
}
