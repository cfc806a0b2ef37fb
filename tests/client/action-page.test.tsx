import type { ActionDetail } from "@shared/schemas/actions";
import { screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import {
  actionId,
  buildActionDetail,
  committeeMember,
  facilitiesLead,
  siteAuditor,
} from "./support/action-data";
import { errorResponse, jsonResponse, stubApi, tamsinGeneral } from "./support/api-stub";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const actionUrl = `/actions/${actionId}`;
const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;
const colleague = { id: "9f0a1b2c-3d4e-4f5a-8b6c-7d8e9f0a1b2c", name: "Alder Quinn" };

function stubAction(me: typeof facilitiesLead, detail: ActionDetail, extra = {}) {
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(me),
    [`GET /api/actions/${actionId}`]: () => jsonResponse(detail),
    [`GET /api/sites/${tamsinGeneral.id}/action-assignees`]: () =>
      jsonResponse({ people: [{ id: me.user.id, name: me.user.name }, colleague] }),
    ...extra,
  });
}

function moveButtons(): string[] {
  const moves = screen.getByRole("heading", { name: "What happens next" }).parentElement!;
  return within(moves)
    .queryAllByRole("button")
    .map((button) => button.textContent ?? "");
}

describe("the action page", () => {
  it("when it opens, then it shows the item, where, severity, status, the due time in the site's zone, owner, finding and timeline", async () => {
    stubAction(siteAuditor, buildActionDetail({ overdue: true }));
    renderApp(actionUrl);

    expect(
      await screen.findByRole("heading", { level: 1, name: "Dirty chair present and labelled" }),
    ).toBeTruthy();
    expect(screen.getByText(/Doffing area 4 \(Doffing area\)/)).toBeTruthy();
    expect(screen.getByText("Critical")).toBeTruthy();
    expect(screen.getByText("To fix")).toBeTruthy();
    expect(screen.getByText("Overdue")).toBeTruthy();
    // 08:00 UTC on 31 March 2026 is 09:00 British Summer Time.
    expect(screen.getByText("Tue 31 Mar 2026, 09:00 BST")).toBeTruthy();
    expect(screen.getByText("Jonah Whitlock")).toBeTruthy();
    expect(screen.getByText("No chair at all; staff sat on the bin lid.")).toBeTruthy();
    const photo = screen.getByRole("img", { name: "Finding 1, photo 1" });
    expect(photo.getAttribute("src")).toContain("variant=thumb");
    expect(photo.closest("a")?.getAttribute("href")).toContain("variant=display");
    const timeline = screen.getByRole("list", { name: "History" });
    expect(timeline.textContent).toContain("Raised from a finding");
    expect(
      await screen.findByRole("region", { name: "Where Doffing area 4 is on Ward 4 East" }),
    ).toBeTruthy();
    expect(screen.getByRole("complementary", { name: "Caution" })).toBeTruthy();
  });

  it("when a facilities lead opens an action to fix, then they may start fixing, add a photo and change its owner, but not confirm it", async () => {
    stubAction(facilitiesLead, buildActionDetail({ state: "to_fix" }));
    renderApp(actionUrl);

    expect(await screen.findByRole("button", { name: "Start fixing" })).toBeTruthy();
    const photo = screen.getByLabelText("Add a photo of the fix");
    expect(photo.getAttribute("accept")).toBe("image/*");
    expect(photo.getAttribute("capture")).toBe("environment");
    expect(screen.getByRole("combobox", { name: "New owner" })).toBeTruthy();
    expect(moveButtons()).toEqual(["Start fixing", "Change owner"]);
    expect(screen.queryByRole("button", { name: "Ask for a check" })).toBeNull();
  });

  it("when a facilities lead opens an action being fixed, then they may ask for a check and are told a photo is needed", async () => {
    stubAction(facilitiesLead, buildActionDetail({ state: "fixing" }));
    renderApp(actionUrl);

    expect(await screen.findByRole("button", { name: "Ask for a check" })).toBeTruthy();
    expect(screen.getByLabelText("Note for the auditor")).toBeTruthy();
    expect(
      screen.getByText('A photo of the fix is needed before you can "Ask for a check".'),
    ).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Start fixing" })).toBeNull();
  });

  it("when an auditor opens a fix to check, then they may confirm it or send it back, and nothing else", async () => {
    stubAction(siteAuditor, buildActionDetail({ state: "to_check" }));
    renderApp(actionUrl);

    expect(await screen.findByRole("button", { name: "Confirm the fix" })).toBeTruthy();
    expect(screen.getByLabelText("What you saw")).toBeTruthy();
    expect(screen.getByLabelText("Why it goes back")).toBeTruthy();
    expect(moveButtons()).toEqual(["Confirm the fix", "Send back"]);
    expect(screen.queryByLabelText("Add a photo of the fix")).toBeNull();
  });

  it("when an auditor opens an action to fix, then there is nothing for them to do yet", async () => {
    stubAction(siteAuditor, buildActionDetail({ state: "to_fix" }));
    renderApp(actionUrl);

    await screen.findByRole("heading", { name: "What happens next" });
    expect(moveButtons()).toEqual([]);
    expect(screen.getByText("Raised from a finding; nobody has started on it yet.")).toBeTruthy();
  });

  it("when an auditor opens a done action, then they may reopen it and the days to close are shown", async () => {
    stubAction(
      siteAuditor,
      buildActionDetail({
        state: "done",
        closedAt: "2026-03-31T06:00:00.000Z",
        daysToClose: 0.9,
      }),
    );
    renderApp(actionUrl);

    expect(await screen.findByRole("button", { name: "Reopen" })).toBeTruthy();
    expect(screen.getByLabelText("Why reopen")).toBeTruthy();
    expect(screen.getByText("0.9 days")).toBeTruthy();
  });

  it("when a committee member opens an action, then they read it and make no move", async () => {
    stubAction(committeeMember, buildActionDetail({ state: "to_check" }));
    renderApp(actionUrl);

    await screen.findByRole("heading", { name: "What happens next" });
    expect(moveButtons()).toEqual([]);
    expect(
      screen.getByText("Proof of the fix was sent; an auditor of the site must look at it."),
    ).toBeTruthy();
  });

  it("when a facilities lead asks for a check without a note, then it is refused beside the note and nothing is sent", async () => {
    const { calls } = stubAction(facilitiesLead, buildActionDetail({ state: "fixing" }));
    const { user } = renderApp(actionUrl);

    await user.click(await screen.findByRole("button", { name: "Ask for a check" }));

    const note = screen.getByLabelText("Note for the auditor");
    expect(note.getAttribute("aria-invalid")).toBe("true");
    expect(screen.getByText("Say what was done or seen, in a few words.")).toBeTruthy();
    expect(calls.some((call) => call.method === "POST")).toBe(false);
  });

  it("when the server says a photo of this attempt is needed, then the message is beside the photo control and the note is kept", async () => {
    const proofMessage = "Add a photo of the fix for this attempt before sending it.";
    const { calls } = stubAction(facilitiesLead, buildActionDetail({ state: "fixing" }), {
      [`POST /api/actions/${actionId}/ask-check`]: () =>
        errorResponse(400, "validation_failed", "A photo is needed.", { proof: proofMessage }),
    });
    const { user } = renderApp(actionUrl);

    const note = await screen.findByLabelText("Note for the auditor");
    await user.type(note, "New chair fixed to the wall and labelled.");
    await user.click(screen.getByRole("button", { name: "Ask for a check" }));

    const photo = screen.getByLabelText("Add a photo of the fix");
    const message = await screen.findByText(proofMessage);
    expect(photo.getAttribute("aria-describedby")).toContain(message.id);
    expect(photo.getAttribute("aria-invalid")).toBe("true");
    expect((note as HTMLTextAreaElement).value).toBe("New chair fixed to the wall and labelled.");
    expect(calls.find((call) => call.method === "POST")?.body).toEqual({
      note: "New chair fixed to the wall and labelled.",
    });
  });

  it("when an auditor confirms the fix with a note, then the action comes back done and the history has the move", async () => {
    let detail = buildActionDetail({ state: "to_check" });
    const { calls } = stubAction(siteAuditor, detail, {
      [`GET /api/actions/${actionId}`]: () => jsonResponse(detail),
      [`POST /api/actions/${actionId}/confirm`]: () => {
        detail = buildActionDetail(
          { state: "done", closedAt: "2026-03-31T07:00:00.000Z", daysToClose: 1 },
          {
            timeline: [
              ...detail.timeline,
              {
                id: "6f708192-a3b4-4fc0-9b32-5d6e7f8091a2",
                at: "2026-03-31T07:00:00.000Z",
                kind: "fix_confirmed",
                actorName: siteAuditor.user.name,
                fromState: "to_check",
                toState: "done",
                text: "Chair in place and labelled.",
              },
            ],
          },
        );
        return jsonResponse(detail);
      },
      [`GET /api/sites/${tamsinGeneral.id}/actions`]: () => jsonResponse({ actions: [] }),
      "GET /api/my/actions": () => jsonResponse({ actions: [] }),
    });
    const { user } = renderApp(actionUrl);

    await user.type(await screen.findByLabelText("What you saw"), "Chair in place and labelled.");
    await user.click(screen.getByRole("button", { name: "Confirm the fix" }));

    expect(await screen.findByText("The fix is confirmed: this action is done.")).toBeTruthy();
    expect(screen.getByRole("button", { name: "Reopen" })).toBeTruthy();
    const timeline = screen.getByRole("list", { name: "History" });
    expect(timeline.textContent).toContain("Chair in place and labelled.");
    expect(calls.find((call) => call.method === "POST")?.body).toEqual({
      note: "Chair in place and labelled.",
    });
  });

  it("when a photo of the fix is chosen, then it is uploaded as the photo field", async () => {
    let detail = buildActionDetail({ state: "fixing" });
    const { calls } = stubAction(facilitiesLead, detail, {
      [`GET /api/actions/${actionId}`]: () => jsonResponse(detail),
      [`POST /api/actions/${actionId}/proofs`]: () => {
        detail = buildActionDetail(
          { state: "fixing" },
          {
            proofs: [
              {
                id: "70819293-b4c5-4d01-8c43-6e7f8091a2b3",
                imageId: "8192a3b4-c5d6-4e12-9d54-7f8091a2b3c4",
                uploadedBy: facilitiesLead.user.name,
                createdAt: "2026-03-30T12:00:00.000Z",
                current: true,
              },
            ],
          },
        );
        return jsonResponse(detail, 201);
      },
    });
    const { user } = renderApp(actionUrl);

    const file = new File([new Uint8Array([0xff, 0xd8, 0xff])], "fix.jpg", { type: "image/jpeg" });
    await user.upload(await screen.findByLabelText("Add a photo of the fix"), file);

    expect(await screen.findByRole("img", { name: "Photos of the fix now, photo 1" })).toBeTruthy();
    const upload = calls.find((call) => call.method === "POST");
    expect(upload?.body).toBeInstanceOf(FormData);
    expect((upload?.body as FormData).get("photo")).toBeInstanceOf(File);
    expect((upload?.body as FormData).get("id")).toMatch(uuid);
  });

  it("when a proof's reply is lost, then the photo is sent again under the same id, also when chosen again; a new photo gets a new id", async () => {
    const detail = buildActionDetail({ state: "fixing" });
    let replies = [503, 503, 503, 201, 201];
    const { calls } = stubAction(facilitiesLead, detail, {
      [`GET /api/actions/${actionId}`]: () => jsonResponse(detail),
      [`POST /api/actions/${actionId}/proofs`]: () => {
        const [status, ...rest] = replies;
        replies = rest;
        return status === 201
          ? jsonResponse(detail, 201)
          : errorResponse(503, "unavailable", "Lintel cannot reach its database just now.");
      },
    });
    const { user } = renderApp(actionUrl);
    const photo = new File([new Uint8Array([0xff, 0xd8, 0xff])], "fix.jpg", {
      type: "image/jpeg",
      lastModified: 1_700_000_000_000,
    });
    const sentIds = () =>
      calls
        .filter((call) => call.method === "POST")
        .map((call) => (call.body as FormData).get("id"));

    await user.upload(await screen.findByLabelText("Add a photo of the fix"), photo);
    // Sent, then twice more by itself; the third failure is shown.
    expect(
      await screen.findByText(/cannot reach its database/, {}, { timeout: 3000 }),
    ).toBeTruthy();
    expect(sentIds()).toHaveLength(3);

    await user.upload(screen.getByLabelText("Add a photo of the fix"), photo);
    await waitFor(() => expect(sentIds()).toHaveLength(4));
    await waitFor(() => expect(screen.queryByText(/cannot reach its database/)).toBeNull());
    const [first, ...again] = sentIds();
    expect(first).toMatch(uuid);
    expect(again).toEqual([first, first, first]);

    const another = new File([new Uint8Array([0xff, 0xd8, 0xfe])], "fix-2.jpg", {
      type: "image/jpeg",
      lastModified: 1_700_000_100_000,
    });
    await user.upload(screen.getByLabelText("Add a photo of the fix"), another);
    await waitFor(() => expect(sentIds()).toHaveLength(5));
    expect(sentIds()[4]).toMatch(uuid);
    expect(sentIds()[4]).not.toBe(first);
  });
  it("when a photo of the fix is still uploading, then asking for a check waits for it", async () => {
    const detail = buildActionDetail({ state: "fixing" });
    let finish: (response: Response) => void = () => undefined;
    stubAction(facilitiesLead, detail, {
      [`GET /api/actions/${actionId}`]: () => jsonResponse(detail),
      [`POST /api/actions/${actionId}/proofs`]: () =>
        new Promise<Response>((resolve) => {
          finish = resolve;
        }),
    });
    const { user } = renderApp(actionUrl);
    const send = await screen.findByRole("button", { name: "Ask for a check" });
    expect((send as HTMLButtonElement).disabled).toBe(false);

    const file = new File([new Uint8Array([0xff, 0xd8, 0xff])], "fix.jpg", { type: "image/jpeg" });
    await user.upload(screen.getByLabelText("Add a photo of the fix"), file);
    await waitFor(() =>
      expect(
        (screen.getByRole("button", { name: "Ask for a check" }) as HTMLButtonElement).disabled,
      ).toBe(true),
    );
    finish(jsonResponse(detail, 201));
    await waitFor(() =>
      expect(
        (screen.getByRole("button", { name: "Ask for a check" }) as HTMLButtonElement).disabled,
      ).toBe(false),
    );
  });
});
