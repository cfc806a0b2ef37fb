import { describe, expect, it } from "vitest";

import { paths, safeNextPath } from "@/config/paths";

describe("safeNextPath", () => {
  it.each([
    ["/account", "/account"],
    ["/sites/abc?tab=plans#top", "/sites/abc?tab=plans#top"],
  ])("when next is the app path %s, then it is kept", (next, expected) => {
    expect(safeNextPath(next)).toBe(expected);
  });

  it.each([
    [null],
    [""],
    ["https://elsewhere.example/"],
    ["//elsewhere.example/path"],
    ["/\\elsewhere.example"],
    ["javascript:alert(1)"],
    ["account"],
    ["/sign-in?next=/account"],
    ["/sign-in/?next=//elsewhere.example"],
  ])("when next is %s, then it falls back to home", (next) => {
    expect(safeNextPath(next)).toBe("/");
  });

  it.each([
    // Dot segments that collapse to a protocol-relative address once normalised.
    ["/.//elsewhere.example/x"],
    ["/..//elsewhere.example/x"],
    ["/a/../..//elsewhere.example"],
    ["/%2e%2e//elsewhere.example"],
    ["/%2E//elsewhere.example"],
    ["/./%2e/.//elsewhere.example"],
    // Encoded slashes and backslashes.
    ["/%2F%2Felsewhere.example"],
    ["/%2felsewhere.example"],
    ["/%5Celsewhere.example"],
    ["/%5c%5celsewhere.example"],
    ["/\\elsewhere.example"],
    ["/\\/elsewhere.example"],
    ["\\\\elsewhere.example"],
    // Whitespace and controls a browser strips or ignores inside a URL.
    ["/\t/elsewhere.example"],
    ["/\n/elsewhere.example"],
    ["/\r/elsewhere.example"],
    [" //elsewhere.example"],
    ["/ /elsewhere.example"],
    ["\u0000//elsewhere.example"],
    ["/\u3000/elsewhere.example"],
    ["/%09/elsewhere.example"],
    ["/%00"],
    // Other schemes, with and without a leading slash.
    ["data:text/html,<script>alert(1)</script>"],
    ["JaVaScRiPt:alert(1)"],
    ["vbscript:msgbox(1)"],
    ["http:elsewhere.example"],
    ["https:/elsewhere.example"],
    ["mailto:someone@elsewhere.example"],
    // Credentials and a bare host, and a malformed escape.
    ["//user:pass@elsewhere.example"],
    ["/%"],
    ["/%E0%A4%A"],
  ])("when next is %j, then it cannot leave the app and falls back to home", (next) => {
    const safe = safeNextPath(next);
    expect(safe).toBe("/");
  });

  it("when next is any of these, then the answer is a path of this app that resolves to this origin", () => {
    const tries = [
      "/.//elsewhere.example/x",
      "/..//elsewhere.example/x",
      "/sites/./abc/../def",
      "/sites/%2e%2e/audits",
      "/account?next=//elsewhere.example",
      "/account#//elsewhere.example",
      "/sites/abc?x=%2F%2Felsewhere",
      "/javascript:alert(1)//",
    ];
    for (const next of tries) {
      const safe = safeNextPath(next);
      expect(safe.startsWith("/")).toBe(true);
      expect(safe.startsWith("//")).toBe(false);
      const resolved = new URL(safe, "https://app.example/sign-in?next=x");
      expect(resolved.origin).toBe("https://app.example");
      expect(safeNextPath(safe)).toBe(safe);
    }
  });

  it.each([
    ["/sites/./abc/../def", "/sites/def"],
    ["/account?next=//elsewhere.example", "/account?next=//elsewhere.example"],
    ["/sites/%E2%9C%93", "/sites/%E2%9C%93"],
  ])(
    "when next is %s with dot segments or a harmless query, then the tidied path %s is kept",
    (next, expected) => {
      expect(safeNextPath(next)).toBe(expected);
    },
  );

  it("when a sign-in link is built for a page, then the page travels in next", () => {
    expect(paths.signIn.getHref("/sites/abc")).toBe("/sign-in?next=%2Fsites%2Fabc");
    expect(paths.signIn.getHref("/")).toBe("/sign-in");
    expect(paths.signIn.getHref("//elsewhere.example")).toBe("/sign-in");
  });
});
