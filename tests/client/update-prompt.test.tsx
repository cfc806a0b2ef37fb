import { act, render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { describe, expect, it, vi } from "vitest";

import { UpdatePrompt } from "@/app/update-prompt";
import { announceUpdateWaiting } from "@/lib/app-updates";

describe("the new-version banner", () => {
  it("when the service worker finds a new version waiting, then a banner says so and Reload swaps it in once", async () => {
    render(
      <main>
        <h1>Doffing area 1</h1>
        <UpdatePrompt />
      </main>,
    );
    expect(screen.queryByRole("status")).toBeNull();

    const apply = vi.fn(() => new Promise<void>(() => {}));
    act(() => announceUpdateWaiting(apply));

    const banner = screen.getByRole("status");
    expect(banner).toHaveProperty(
      "textContent",
      expect.stringContaining("A new version of Lintel is ready"),
    );
    // It floats over the page: showing it moves nothing.
    expect(banner.parentElement?.className).toMatch(/\bfixed\b/);

    await userEvent.click(screen.getByRole("button", { name: "Reload" }));
    expect(apply).toHaveBeenCalledTimes(1);
    const reloading = screen.getByRole("button", { name: "Reloading…" });
    expect(reloading).toHaveProperty("disabled", true);
    await userEvent.click(reloading);
    expect(apply).toHaveBeenCalledTimes(1);
  });
});
