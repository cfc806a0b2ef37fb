import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { cleanup, render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import type { AuditDetail } from "@shared/schemas/audits";

import { AmendAuditForm } from "@/features/walkthroughs/components/amend-audit-form";

// The form's own chunk cannot be fetched (a phone offline before the app was kept for offline
// use): its import fails as a browser's does.
vi.mock("@/features/walkthroughs/components/amend-audit-form-body", () => {
  throw new TypeError("Failed to fetch dynamically imported module");
});

const detail = {
  audit: { id: crypto.randomUUID(), siteId: crypto.randomUUID() },
  items: [],
  answers: [],
  photos: [],
  room: null,
} as unknown as AuditDetail;

afterEach(cleanup);

describe("amending a submitted audit without the form's code", () => {
  it("when the panel is opened and the form cannot be loaded, then it says so and the audit stays on screen", async () => {
    render(
      <QueryClientProvider client={new QueryClient()}>
        <h1>Audit of Doffing area 1</h1>
        <AmendAuditForm detail={detail} />
      </QueryClientProvider>,
    );
    expect(screen.queryByRole("alert")).toBeNull();
    await userEvent.click(screen.getByText("Amend an answer"));
    const alert = await screen.findByRole("alert");
    expect(alert.textContent).toMatch(/could not be loaded\. Amending needs a connection/);
    expect(screen.getByRole("heading", { name: "Audit of Doffing area 1" })).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Record amendment" })).toBeNull();
  });
});
