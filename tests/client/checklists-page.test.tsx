import type { ChecklistDraftBody, ChecklistVersion } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";
import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { administrator, auditor, jsonResponse, stubApi } from "./support/api-stub";
import { buildItem } from "./support/audit-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

function version(zoneType: ZoneType, overrides: Partial<ChecklistVersion> = {}): ChecklistVersion {
  return {
    id: crypto.randomUUID(),
    zoneType,
    version: 1,
    status: "published",
    title: "Doffing area readiness",
    publishedAt: "2026-01-05T09:00:00.000Z",
    items: [
      buildItem({
        key: "doff.separate",
        text: "Physically separate from the donning zone",
        position: 0,
      }),
      buildItem({
        key: "doff.dirty-chair",
        text: "Dirty chair present and labelled as dirty",
        position: 1,
      }),
      buildItem({
        key: "doff.hand-rub-stations",
        text: "Number of working hand-rub stations",
        severity: "major",
        response: "count",
        threshold: { op: ">=", value: 2 },
        position: 2,
      }),
    ],
    ...overrides,
  };
}

function checklists() {
  return {
    checklists: (["isolation_room", "anteroom", "donning_zone", "doffing_area"] as const).map(
      (zoneType) => ({ zoneType, published: version(zoneType), draft: null, defaultUpdate: null }),
    ),
  };
}

const signedInAs = (me: typeof administrator) => ({
  "GET /api/auth/me": () => jsonResponse(me),
  "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
  "GET /api/checklists": () => jsonResponse(checklists()),
});

describe("the checklist editor", () => {
  it("when an auditor opens it, then it is not available and nothing is asked of the server", async () => {
    const { calls } = stubApi(signedInAs(auditor));
    renderApp("/admin/checklists");

    expect(
      await screen.findByRole("heading", { level: 1, name: "This page is not available" }),
    ).toBeTruthy();
    expect(calls.some((call) => call.path === "/api/checklists")).toBe(false);
  });

  it("when an administrator rewords, reorders, retires and adds items, then the draft keeps the kept items' keys in the new order and publishes as the next version", async () => {
    const { calls } = stubApi({
      ...signedInAs(administrator),
      "PUT /api/checklists/doffing_area/draft": (request) =>
        jsonResponse({
          draft: version("doffing_area", {
            version: 2,
            status: "draft",
            publishedAt: null,
            title: (request.body as ChecklistDraftBody).title,
          }),
        }),
      "POST /api/checklists/doffing_area/publish": () =>
        jsonResponse({ published: version("doffing_area", { version: 2 }) }),
    });
    const { user } = renderApp("/admin/checklists");

    expect(await screen.findByRole("link", { name: "Checklists" })).toBeTruthy();
    const doffing = await screen.findByRole("region", { name: "Doffing area" });
    expect(within(doffing).getByText(/Doffing area readiness · version 1/)).toBeTruthy();
    await user.click(within(doffing).getByRole("button", { name: /Edit draft/ }));

    await screen.findByRole("heading", { level: 1, name: "Doffing area checklist" });
    const texts = () => screen.getAllByLabelText("Text") as HTMLTextAreaElement[];
    await user.clear(texts()[1]!);
    await user.type(texts()[1]!, "Dirty chair present, labelled, and wiped since last use");
    await user.click(screen.getByRole("button", { name: "Move up item 2" }));
    await user.click(screen.getByRole("button", { name: "Retire item 3" }));
    await user.click(screen.getByRole("button", { name: "Add item" }));
    await user.type(texts()[2]!, "Spare clean gloves in several sizes");
    await user.selectOptions(screen.getAllByLabelText("Severity")[2]!, "major");
    // How an item is answered is said in words, with a hint listing the kinds.
    const answered = screen.getAllByLabelText("How the auditor answers")[2]!;
    expect(
      (answered.getAttribute("aria-describedby") ?? "")
        .split(" ")
        .map((id) => document.getElementById(id)?.textContent ?? "")
        .join(" "),
    ).toContain("Pass or fail, a measured reading, a count, or one of a few choices.");
    await user.click(screen.getByRole("button", { name: "Publish version 2" }));

    await screen.findByText("Doffing area checklist version 2 is published. New audits use it.");
    const saved = calls.find((call) => call.method === "PUT")?.body as ChecklistDraftBody;
    expect(saved.items.map((item) => [item.key, item.text])).toEqual([
      ["doff.dirty-chair", "Dirty chair present, labelled, and wiped since last use"],
      ["doff.separate", "Physically separate from the donning zone"],
      [undefined, "Spare clean gloves in several sizes"],
    ]);
    expect(saved.items[2]).toMatchObject({
      severity: "major",
      response: "check",
      photoOnFail: true,
    });
    expect(calls.filter((call) => call.method === "POST").map((call) => call.path)).toEqual([
      "/api/checklists/doffing_area/publish",
    ]);
  });

  it("when a new item is left without text or severity, then the form says so and nothing is sent", async () => {
    const { calls } = stubApi(signedInAs(administrator));
    const { user } = renderApp("/admin/checklists?edit=doffing_area");

    await screen.findByRole("heading", { level: 1, name: "Doffing area checklist" });
    await user.click(screen.getByRole("button", { name: "Add item" }));
    await user.click(screen.getByRole("button", { name: "Save draft" }));

    const text = screen.getAllByLabelText("Text")[3]!;
    await vi.waitFor(() => expect(text.getAttribute("aria-invalid")).toBe("true"));
    expect(screen.getAllByLabelText("Severity")[3]!.getAttribute("aria-invalid")).toBe("true");
    expect(calls.some((call) => call.method === "PUT")).toBe(false);
  });

  it("when the network edited a checklist and Lintel's defaults moved on, then the page says the new default waits as a draft beside the network's version", async () => {
    const list = checklists();
    const doffing = list.checklists.find((entry) => entry.zoneType === "doffing_area")!;
    Object.assign(doffing, {
      published: version("doffing_area", { version: 2 }),
      draft: version("doffing_area", { version: 3, status: "draft", publishedAt: null }),
      defaultUpdate: { revision: 2 },
    });
    stubApi({ ...signedInAs(administrator), "GET /api/checklists": () => jsonResponse(list) });
    renderApp("/admin/checklists");

    const card = (await screen.findByRole("heading", { name: "Doffing area" })).closest("section")!;
    expect(within(card).getByText("Lintel's default checklist has a version 2")).toBeTruthy();
    expect(card.textContent).toMatch(/waits as the draft of version 3, beside your version 2/);
    expect(card.textContent).toMatch(/every audit uses version 2/);
    // The other kinds of space have no offer, so they say nothing of it.
    const room = screen.getByRole("heading", { name: "Isolation room" }).closest("section")!;
    expect(room.textContent).not.toMatch(/default checklist has a version/);
  });
});
