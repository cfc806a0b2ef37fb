import { QueryClientProvider } from "@tanstack/react-query";
import { render, screen } from "@testing-library/react";
import { userEvent } from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import { PlanUploadForm } from "@/features/floor-plans/components/plan-upload-form";
import { planFileProblem } from "@/features/floor-plans/lib/plan-upload";
import { createQueryClient } from "@/lib/query-client";

import { errorResponse, jsonResponse, stubApi } from "./support/api-stub";
import { buildFloor, floorId } from "./support/floor-data";

afterEach(() => {
  vi.unstubAllGlobals();
});

function renderForm({ hasPlan = false } = {}) {
  // The file input accepts only images, as the browser's picker would; tests bypass it.
  const user = userEvent.setup({ applyAccept: false });
  render(
    <QueryClientProvider client={createQueryClient()}>
      <PlanUploadForm floorId={floorId} hasPlan={hasPlan} />
    </QueryClientProvider>,
  );
  return { user };
}

function describedText(input: HTMLElement): string {
  return (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");
}

const png = () =>
  new File([new Uint8Array([137, 80, 78, 71])], "ward-4.png", { type: "image/png" });

describe("PlanUploadForm", () => {
  it("when Upload plan is pressed with no file, then it asks for one and sends nothing", async () => {
    const { fetchStub } = stubApi({});
    const { user } = renderForm();

    await user.click(screen.getByRole("button", { name: "Upload plan" }));

    const input = screen.getByLabelText("Floor plan image");
    expect(describedText(input)).toContain("Choose an image of the floor plan first.");
    expect(input.getAttribute("aria-invalid")).toBe("true");
    expect(document.activeElement).toBe(input);
    expect(fetchStub).not.toHaveBeenCalled();
  });

  it("when the file is not JPEG, PNG or WebP, then it says which kinds are accepted and sends nothing", async () => {
    const { fetchStub } = stubApi({});
    const { user } = renderForm();

    await user.upload(
      screen.getByLabelText("Floor plan image"),
      new File(["x"], "plan.heic", { type: "image/heic" }),
    );
    await user.click(screen.getByRole("button", { name: "Upload plan" }));

    expect(describedText(screen.getByLabelText("Floor plan image"))).toContain(
      "This file is not a JPEG, PNG or WebP image.",
    );
    expect(fetchStub).not.toHaveBeenCalled();
  });

  it("when the server refuses the file's content, then its message appears beside the field", async () => {
    stubApi({
      [`PUT /api/floors/${floorId}/plan`]: () =>
        errorResponse(415, "unsupported_media_type", "Upload a JPEG, PNG or WebP image."),
    });
    const { user } = renderForm();

    await user.upload(screen.getByLabelText("Floor plan image"), png());
    await user.click(screen.getByRole("button", { name: "Upload plan" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Floor plan image"))).toContain(
        "Upload a JPEG, PNG or WebP image.",
      ),
    );
  });

  it("when the server finds the file too big, then its message appears beside the field", async () => {
    stubApi({
      [`PUT /api/floors/${floorId}/plan`]: () =>
        errorResponse(413, "payload_too_large", "The image is larger than 15 MB."),
    });
    const { user } = renderForm({ hasPlan: true });

    await user.upload(screen.getByLabelText("Floor plan image"), png());
    await user.click(screen.getByRole("button", { name: "Replace plan" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Floor plan image"))).toContain(
        "The image is larger than 15 MB.",
      ),
    );
  });

  it("when a plan is uploaded, then the file goes as multipart form data in the field plan", async () => {
    const { calls } = stubApi({
      [`PUT /api/floors/${floorId}/plan`]: () => jsonResponse({ floor: buildFloor() }),
      [`GET /api/floors/${floorId}`]: () => errorResponse(404, "not_found", "Not here."),
      [`GET /api/sites/${buildFloor().siteId}/floors`]: () => jsonResponse({ floors: [] }),
    });
    const { user } = renderForm();
    const file = png();

    await user.upload(screen.getByLabelText("Floor plan image"), file);
    await user.click(screen.getByRole("button", { name: "Upload plan" }));

    expect(await screen.findByText("The new plan is uploaded.")).toBeTruthy();
    const body = calls.find((call) => call.method === "PUT")?.body;
    expect(body).toBeInstanceOf(FormData);
    expect((body as FormData).get("plan")).toBeInstanceOf(File);
    expect(((body as FormData).get("plan") as File).name).toBe("ward-4.png");
  });
});

describe("planFileProblem", () => {
  it("when an image is over 15 MB, then it names its size and the limit", () => {
    const big = new File([new Uint8Array(16 * 1024 * 1024)], "scan.jpg", { type: "image/jpeg" });
    expect(planFileProblem(big)).toBe("This image is 16.0 MB; a plan can be at most 15 MB.");
  });

  it("when the browser cannot tell the type, then the server is left to judge the content", () => {
    expect(planFileProblem(new File(["x"], "plan", { type: "" }))).toBeNull();
  });

  it("when the file is a WebP, JPEG or PNG within the limit, then there is no problem", () => {
    for (const type of ["image/webp", "image/jpeg", "image/png"]) {
      expect(planFileProblem(new File(["x"], "plan", { type }))).toBeNull();
    }
  });
});
