import { describe, expect, it } from "vitest";

import { categoryOfItem, itemCategories } from "@shared/checklists/categories";
import { defaultChecklists } from "@shared/checklists/defaults";

describe("item groups", () => {
  it("when an item comes from a default checklist, then it belongs to a named group, not other", () => {
    const keys = Object.values(defaultChecklists).flatMap((list) => list.items.map((i) => i.key));
    expect(keys.length).toBeGreaterThan(40);
    for (const key of keys) expect(categoryOfItem(key), key).not.toBe("other");
    // Every named group is used by at least one default item.
    const used = new Set(keys.map(categoryOfItem));
    expect([...used].sort()).toEqual(itemCategories.filter((c) => c !== "other").sort());
  });

  it("when an administrator adds an item of their own, then it counts under other", () => {
    expect(categoryOfItem("item-1a2b3c4d")).toBe("other");
  });
});
