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
  ])("when next is %s, then it falls back to home", (next) => {
    expect(safeNextPath(next)).toBe("/");
  });

  it("when a sign-in link is built for a page, then the page travels in next", () => {
    expect(paths.signIn.getHref("/sites/abc")).toBe("/sign-in?next=%2Fsites%2Fabc");
    expect(paths.signIn.getHref("/")).toBe("/sign-in");
    expect(paths.signIn.getHref("//elsewhere.example")).toBe("/sign-in");
  });
});
