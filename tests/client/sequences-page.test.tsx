import type { SequenceDraftBody, SequenceVersion } from "@shared/schemas/observations";
import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import {
  readRetentionDays,
  retentionText,
  sequenceKeyFrom,
} from "@/features/admin/lib/sequence-form";

import { administrator, auditor, jsonResponse, stubApi } from "./support/api-stub";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

function step(key: string, text: string, position: number, handHygiene = false) {
  return {
    id: crypto.randomUUID(),
    key,
    position,
    text,
    handHygiene,
    watchFor: ["out_of_order" as const],
    reference: "CDC, removal example 1",
  };
}

function removal(overrides: Partial<SequenceVersion> = {}): SequenceVersion {
  return {
    id: crypto.randomUUID(),
    key: "standard-removal-1",
    kind: "removal",
    version: 1,
    status: "published",
    title: "Removal, standard ensemble",
    note: null,
    publishedAt: "2026-01-05T09:00:00.000Z",
    steps: [
      step("gloves", "Remove gloves", 0),
      step("goggles", "Remove goggles or face shield", 1),
      step("gown", "Remove gown", 2),
    ],
    ...overrides,
  };
}

function enhancedDraft(): SequenceVersion {
  return removal({
    key: "enhanced-removal",
    title: "Removal, enhanced ensemble",
    status: "draft",
    publishedAt: null,
    note: "Lintel's draft, common practice",
    steps: [step("outer-gloves", "Remove outer gloves", 0, true)],
  });
}

const sequences = () => ({
  sequences: [
    { key: "standard-removal-1", published: removal(), draft: null },
    { key: "enhanced-removal", published: null, draft: enhancedDraft() },
  ],
});

const signedInAs = (me: typeof administrator) => ({
  "GET /api/auth/me": () => jsonResponse(me),
  "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
  "GET /api/sequences": () => jsonResponse(sequences()),
  "GET /api/observation-settings": () => jsonResponse({ retentionDays: 730 }),
});

describe("the administrator's observation steps", () => {
  it("when an auditor opens the page, then it is not available and nothing is asked of the server", async () => {
    const { calls } = stubApi(signedInAs(auditor));
    renderApp("/admin/sequences");

    expect(
      await screen.findByRole("heading", { level: 1, name: "This page is not available" }),
    ).toBeTruthy();
    expect(calls.some((call) => call.path.startsWith("/api/sequences"))).toBe(false);
  });

  it("when the list opens, then each sequence shows its published version, its draft and Lintel's note where set", async () => {
    stubApi(signedInAs(administrator));
    renderApp("/admin/sequences");

    const standard = await screen.findByRole("region", { name: "Removal, standard ensemble" });
    expect(standard.textContent).toMatch(/Removal · version 1, published .* · 3 steps/);
    expect(within(standard).queryByText(/Draft of version/)).toBeNull();
    const enhanced = screen.getByRole("region", { name: "Removal, enhanced ensemble" });
    expect(within(enhanced).getByText("Lintel's draft, common practice")).toBeTruthy();
    expect(within(enhanced).getByText("Draft of version 1")).toBeTruthy();
    expect(enhanced.textContent).toContain("not published yet");
  });

  it("when an administrator rewords, reorders and adds a step, then publishing asks first and the draft keeps the kept steps' keys in the new order", async () => {
    const { calls } = stubApi({
      ...signedInAs(administrator),
      "PUT /api/sequences/standard-removal-1/draft": (request) =>
        jsonResponse({
          sequence: removal({
            version: 2,
            status: "draft",
            publishedAt: null,
            title: (request.body as SequenceDraftBody).title,
          }),
        }),
      "POST /api/sequences/standard-removal-1/publish": () =>
        jsonResponse({ published: removal({ version: 2 }) }),
    });
    const { user } = renderApp("/admin/sequences");

    const standard = await screen.findByRole("region", { name: "Removal, standard ensemble" });
    await user.click(within(standard).getByRole("button", { name: /Edit draft/ }));
    await screen.findByRole("heading", { level: 1, name: "Removal, standard ensemble" });
    const texts = () => screen.getAllByLabelText("Read aloud") as HTMLTextAreaElement[];
    await user.clear(texts()[0]!);
    await user.type(texts()[0]!, "Remove gloves, outside to inside");
    await user.click(screen.getByRole("button", { name: "Move down step 2" }));
    await user.click(screen.getByRole("button", { name: "Add step" }));
    await user.type(texts()[3]!, "Perform hand hygiene");
    await user.click(screen.getAllByLabelText("Includes a hand-hygiene moment")[3]!);
    await user.click(screen.getAllByLabelText("Hand hygiene missed")[3]!);
    await user.type(screen.getAllByLabelText("Reference")[3]!, "Common practice");

    await user.click(screen.getByRole("button", { name: "Publish version 2" }));
    const confirm = await screen.findByRole("group", {
      name: "Publish version 2 of Removal, standard ensemble?",
    });
    expect(confirm.textContent).toContain("keep the version they followed");
    expect(calls.some((call) => call.method === "PUT" || call.method === "POST")).toBe(false);
    await user.click(within(confirm).getByRole("button", { name: "Publish version 2" }));

    await screen.findByText(
      "Removal, standard ensemble, version 2, is published. Observations started from now on follow it.",
    );
    const saved = calls.find((call) => call.method === "PUT")?.body as SequenceDraftBody;
    expect(saved.kind).toBe("removal");
    expect(saved.steps.map((entry) => [entry.key, entry.text])).toEqual([
      ["gloves", "Remove gloves, outside to inside"],
      ["gown", "Remove gown"],
      ["goggles", "Remove goggles or face shield"],
      [undefined, "Perform hand hygiene"],
    ]);
    expect(saved.steps[3]).toEqual({
      text: "Perform hand hygiene",
      handHygiene: true,
      watchFor: ["hand_hygiene_missed"],
      reference: "Common practice",
    });
    expect(saved.steps[0]!.watchFor).toEqual(["out_of_order"]);
    expect(calls.filter((call) => call.method === "POST").map((call) => call.path)).toEqual([
      "/api/sequences/standard-removal-1/publish",
    ]);
  });

  it("when publishing is called off at the question, then nothing is sent", async () => {
    const { calls } = stubApi(signedInAs(administrator));
    const { user } = renderApp("/admin/sequences?edit=standard-removal-1");

    await user.click(await screen.findByRole("button", { name: "Publish version 2" }));
    const confirm = await screen.findByRole("group", { name: /Publish version 2/ });
    await user.click(within(confirm).getByRole("button", { name: "Cancel" }));

    expect(screen.queryByRole("group", { name: /Publish version 2/ })).toBeNull();
    expect(calls.some((call) => call.method !== "GET")).toBe(false);
  });

  it("when a draft is discarded, then the page asks first and then deletes it", async () => {
    const { calls } = stubApi({
      ...signedInAs(administrator),
      "DELETE /api/sequences/enhanced-removal/draft": () => new Response(null, { status: 204 }),
    });
    const { user } = renderApp("/admin/sequences?edit=enhanced-removal");

    await user.click(await screen.findByRole("button", { name: "Discard draft" }));
    expect(calls.some((call) => call.method === "DELETE")).toBe(false);
    const confirm = await screen.findByRole("group", { name: "Discard the draft of version 1?" });
    await user.click(within(confirm).getByRole("button", { name: "Discard draft" }));

    await screen.findByText("The draft of Removal, enhanced ensemble is discarded.");
    expect(calls.filter((call) => call.method === "DELETE").map((call) => call.path)).toEqual([
      "/api/sequences/enhanced-removal/draft",
    ]);
  });

  it("when a step is left without words or a new sequence takes a key in use, then the form says so and nothing is sent", async () => {
    const { calls } = stubApi(signedInAs(administrator));
    const { user } = renderApp("/admin/sequences?new");

    await screen.findByRole("heading", { level: 1, name: "New sequence" });
    await user.type(screen.getByLabelText("Title"), "Standard removal 1");
    await user.tab();
    expect((screen.getByLabelText("Key") as HTMLInputElement).value).toBe("standard-removal-1");
    await user.selectOptions(screen.getByLabelText("Kind"), "removal");
    await user.click(screen.getByRole("button", { name: "Save draft" }));

    const text = screen.getByLabelText("Read aloud");
    await vi.waitFor(() => expect(text.getAttribute("aria-invalid")).toBe("true"));
    await user.type(text, "Remove gloves");
    await user.click(screen.getByRole("button", { name: "Save draft" }));
    await screen.findByText("Another sequence has this key already.");
    expect(calls.some((call) => call.method !== "GET")).toBe(false);
  });

  it("when the retention period is set outside its bounds, then it is refused in words; within them it is saved", async () => {
    const { calls } = stubApi({
      ...signedInAs(administrator),
      "PUT /api/observation-settings": (request) => jsonResponse(request.body),
    });
    const { user } = renderApp("/admin/sequences");

    const region = await screen.findByRole("region", {
      name: "How long observation detail is kept",
    });
    expect(region.textContent).toContain("the staff code of the person observed");
    expect(region.textContent).toContain("what the committee's figures count");
    const days = await within(region).findByLabelText("Keep observation detail for (days)");
    expect((days as HTMLInputElement).value).toBe("730");
    await user.clear(days);
    await user.type(days, "20");
    await user.click(within(region).getByRole("button", { name: "Save retention period" }));
    await within(region).findByText("At least 30 days.");
    expect(calls.some((call) => call.method === "PUT")).toBe(false);

    await user.clear(days);
    await user.type(days, "365");
    await user.click(within(region).getByRole("button", { name: "Save retention period" }));
    await within(region).findByText("Saved: observation detail is kept 365 days (about 1 year).");
    expect(calls.find((call) => call.method === "PUT")?.body).toEqual({ retentionDays: 365 });
  });
});

describe("the sequence form's helpers", () => {
  it("when days are typed, then only whole numbers from 30 to 3650 are read", () => {
    expect(readRetentionDays(" 730 ")).toEqual({ ok: true, days: 730 });
    expect(readRetentionDays("30")).toEqual({ ok: true, days: 30 });
    expect(readRetentionDays("3650")).toEqual({ ok: true, days: 3650 });
    expect(readRetentionDays("29").ok).toBe(false);
    expect(readRetentionDays("3651").ok).toBe(false);
    expect(readRetentionDays("1.5").ok).toBe(false);
    expect(readRetentionDays("").ok).toBe(false);
  });

  it("when a period is put in words, then it rounds to half years or to months", () => {
    expect(retentionText(730)).toBe("730 days (about 2 years)");
    expect(retentionText(548)).toBe("548 days (about 1.5 years)");
    expect(retentionText(90)).toBe("90 days (about 3 months)");
    expect(retentionText(30)).toBe("30 days (about 1 month)");
  });

  it("when a key is made from a title, then it keeps letters, digits and single dashes", () => {
    expect(sequenceKeyFrom("Removal, enhanced ensemble (2)")).toBe("removal-enhanced-ensemble-2");
    expect(sequenceKeyFrom("  Été — retrait ")).toBe("ete-retrait");
  });
});
