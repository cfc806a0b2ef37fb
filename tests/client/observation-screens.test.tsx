import { cleanup, render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import { ObservationRecorder } from "@/features/walkthroughs/components/observation-recorder";
import {
  newObservationDraft,
  type ObservationDraft,
} from "@/features/walkthroughs/lib/observation-flow";

import { doffingAreaSpaceId, puttingOnSequence, removalSequence } from "./support/observation-data";

afterEach(cleanup);

function renderRecorder() {
  const saved: ObservationDraft[] = [];
  const onFinish = vi.fn(async (_draft: ObservationDraft) => {});
  render(
    <ObservationRecorder
      initial={newObservationDraft({
        observationId: "4e000000-0000-4000-8000-000000000009",
        spaceId: doffingAreaSpaceId,
        spaceName: "Doffing area 1",
        zoneType: "doffing_area",
      })}
      sequences={[puttingOnSequence(), removalSequence()]}
      onSave={(draft) => saved.push(draft)}
      onFinish={onFinish}
    />,
  );
  return { saved, onFinish };
}

describe("the observation screens on a phone", () => {
  it("when a name is typed as the staff code, then the observation does not begin and the screen says a code, not a name", async () => {
    const user = userEvent.setup();
    renderRecorder();
    // A doffing area: removal only.
    const sequences = within(screen.getByRole("group", { name: "Sequence" })).getAllByRole(
      "button",
    );
    expect(sequences.map((button) => button.textContent)).toEqual([
      expect.stringMatching(/^Removal, standard ensemble/),
    ]);
    expect(screen.getByText(/never a name/)).toBeTruthy();

    await user.click(sequences[0]!);
    await user.type(screen.getByLabelText("Staff code"), "Jane Smith");
    await user.click(
      within(screen.getByRole("group", { name: "Role" })).getByRole("button", { name: "Nurse" }),
    );
    await user.click(screen.getByRole("button", { name: "Check the area" }));

    expect(screen.getByRole("alert").textContent).toMatch(/staff code.*not a name/);
    expect(screen.queryByRole("heading", { name: "Check the area first" })).toBeNull();
  });

  it("when the observer records each step with one breach caused by the space, then every change is saved and the summary names the breach before Finish", async () => {
    const user = userEvent.setup();
    const { saved, onFinish } = renderRecorder();
    await user.click(
      within(screen.getByRole("group", { name: "Sequence" })).getAllByRole("button")[0]!,
    );
    await user.type(screen.getByLabelText("Staff code"), "hca-17");
    await user.click(
      within(screen.getByRole("group", { name: "Role" })).getByRole("button", {
        name: "Healthcare assistant",
      }),
    );
    await user.click(screen.getByRole("button", { name: "Check the area" }));
    const start = screen.getByRole("button", { name: "Start the steps" });
    expect(start).toHaveProperty("disabled", true);
    for (const check of [
      "Waste container not over-full",
      "Hand rub within reach",
      "Clean and dirty sides marked",
    ]) {
      const yes = within(screen.getByRole("group", { name: check })).getByRole("button", {
        name: check === "Waste container not over-full" ? "No" : "Yes",
      });
      await user.click(yes);
      expect(yes.getAttribute("aria-pressed")).toBe("true");
    }
    await user.click(screen.getByRole("button", { name: "Start the steps" }));

    expect(screen.getByText("Step 1 of 5")).toBeTruthy();
    expect(screen.getByText("Read aloud")).toBeTruthy();
    await user.click(screen.getByRole("button", { name: "Done" }));
    await user.click(screen.getByRole("button", { name: "Breach…" }));
    await user.click(screen.getByRole("button", { name: "Record breach" }));
    expect(screen.getByRole("alert").textContent).toBe("Choose what went wrong.");
    await user.click(
      screen.getByRole("button", { name: "Item dropped or not into the right container" }),
    );
    await user.click(screen.getByRole("button", { name: "The space" }));
    await user.click(screen.getByRole("button", { name: "Record breach" }));
    expect(screen.getByRole("alert").textContent).toBe("Choose what about the space.");
    await user.click(screen.getByRole("button", { name: "Bin full" }));
    await user.click(screen.getByRole("button", { name: "Record breach" }));
    for (const step of [3, 4, 5]) {
      expect(screen.getByText(`Step ${step} of 5`)).toBeTruthy();
      await user.click(screen.getByRole("button", { name: "Done" }));
    }

    expect(screen.getByRole("heading", { name: "Coaching on the spot" })).toBeTruthy();
    expect(screen.getByText(/1 breach, at step 2/)).toBeTruthy();
    await user.click(
      within(screen.getByRole("group", { name: "Coaching given" })).getByRole("button", {
        name: "No",
      }),
    );
    await user.click(screen.getByRole("button", { name: "See the summary" }));

    expect(screen.getByText("Breaches seen — 1 breach, at step 2")).toBeTruthy();
    expect(screen.getByText("Cause: The space — Bin full")).toBeTruthy();
    expect(screen.getByText("HCA-17 · Healthcare assistant")).toBeTruthy();
    // Every change went to the phone's store, the last one at the summary.
    expect(saved.at(-1)).toMatchObject({ phase: "summary", staffCode: "HCA-17" });
    expect(saved.length).toBeGreaterThan(10);

    await user.click(screen.getByRole("button", { name: "Finish" }));
    expect(onFinish).toHaveBeenCalledTimes(1);
    expect(onFinish.mock.calls[0]![0].steps[1]).toMatchObject({
      done: true,
      breaches: [
        { kind: "item_dropped_or_wrong_container", cause: "space", spaceProblem: "bin_full" },
      ],
    });
  });
});
