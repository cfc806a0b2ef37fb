import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import { RegisterAddresses } from "@/features/admin/components/register-addresses";

afterEach(() => {
  vi.unstubAllGlobals();
});

const addresses = {
  redirectUri: "https://lintel.example/api/auth/provider/callback",
  postLogoutRedirectUri: "https://lintel.example/sign-in",
};

describe("a value to copy", () => {
  it("when Copy is chosen, then exactly that value goes to the clipboard and the screen says it was copied", async () => {
    const user = userEvent.setup();
    // After setup: user-event puts a clipboard of its own on the navigator.
    const writeText = vi.fn(() => Promise.resolve());
    vi.stubGlobal("navigator", { ...navigator, clipboard: { writeText } });
    render(<RegisterAddresses {...addresses} />);

    expect(screen.getByText(addresses.redirectUri)).toBeTruthy();
    await user.click(screen.getByRole("button", { name: "Copy post-logout redirect uri" }));

    expect(writeText).toHaveBeenCalledWith(addresses.postLogoutRedirectUri);
    expect((await screen.findAllByRole("status")).map((s) => s.textContent)).toEqual([
      "",
      "Copied.",
    ]);
  });

  it("when the browser allows no copying, then it says to select the value and copy it", async () => {
    const user = userEvent.setup();
    vi.stubGlobal("navigator", { ...navigator, clipboard: undefined });
    render(<RegisterAddresses {...addresses} />);

    await user.click(screen.getByRole("button", { name: "Copy redirect uri" }));

    expect(screen.getAllByRole("status")[0]!.textContent).toBe(
      "This browser did not allow copying: select the address and copy it.",
    );
  });
});
