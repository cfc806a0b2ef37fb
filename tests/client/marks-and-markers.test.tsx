import { render, waitFor, within } from "@testing-library/react";
import { verdictLabels, verdicts } from "@shared/calc/verdict";
import { actionStates, actionStateLabels } from "@shared/workflow/action-workflow";
import { describe, expect, it } from "vitest";

import { chartLines, markerPath, markers, markerShapes } from "@/components/ui/markers";
import { markShapes } from "@/components/ui/marks";
import { VerdictBadge, VerdictBanner } from "@/components/ui/verdict-badge";
import { StateBadge } from "@/features/actions/components/action-badges";
import { actionPinHtml } from "@/features/actions/lib/action-pins";
import { PChart } from "@/features/committee/components/p-chart";
import { ReadinessChart } from "@/features/committee/components/readiness-chart";

import { buildAction } from "./support/action-data";
import { buildComparison, buildTrends } from "./support/committee-data";

/** Every marker drawn inside an element, by vocabulary name. */
function drawnMarkers(root: Element): string[] {
  return [...root.querySelectorAll("[data-marker]")].map((node) =>
    node.getAttribute("data-marker")!,
  );
}

/** A drawn marker must have its vocabulary shape: the same outline commands, only sized. */
function expectVocabularyShape(node: Element) {
  const name = node.getAttribute("data-marker") as keyof typeof markers;
  const marker = markers[name];
  expect(marker, `unknown marker ${name}`).toBeTruthy();
  const commands = (path: string) => path.replace(/-?\d+(\.\d+)?/g, "#").replace(/\s+/g, "");
  expect(commands(node.getAttribute("d")!)).toBe(commands(markerPath(marker.shape, 0, 0, 1)));
}

describe("one marker vocabulary", () => {
  it("when the vocabulary is read, then no shape carries two meanings and every marker has words", () => {
    const shapes = Object.values(markers).map((marker) => marker.shape);
    expect(new Set(shapes).size).toBe(shapes.length);
    for (const marker of Object.values(markers)) {
      expect(markerShapes).toContain(marker.shape);
      expect(marker.words.length).toBeGreaterThan(2);
    }
    // What is drawn differs too, not just the names: outline and paint together.
    const drawings = Object.values(markers).map(
      (marker) => `${markerPath(marker.shape, 12, 12, 9.6)} ${marker.style}`,
    );
    expect(new Set(drawings).size).toBe(drawings.length);
    // The two dashed chart lines are told apart by their dash as well as their colour.
    expect(chartLines.allSites.dash).not.toBe(chartLines.limits.dash);
  });

  it("when the readiness chart draws ranked and small-sample sites, then it uses the vocabulary's circle and ring and its legend names both in words", async () => {
    const { container } = render(
      <ReadinessChart comparison={buildComparison()} table={<p>Table</p>} />,
    );
    const chart = container.querySelector("[role=img]")!;
    await waitFor(() => expect(drawnMarkers(chart).length).toBe(3));
    expect(new Set(drawnMarkers(chart))).toEqual(new Set(["readiness", "smallSample"]));
    chart.querySelectorAll("[data-marker]").forEach(expectVocabularyShape);

    const legend = container.querySelector("figcaption")!;
    for (const name of new Set(drawnMarkers(chart))) {
      expect(drawnMarkers(legend)).toContain(name);
    }
    expect(within(legend as HTMLElement).getByText(markers.smallSample.words)).toBeTruthy();
    expect(legend.textContent).not.toMatch(/diamond/i);
  });

  it("when a p-chart has a month outside its limits, then that month is the vocabulary's triangle, the others its circle, and the legend says so", async () => {
    const site = buildTrends().sites[1]!;
    expect(site.points.some((point) => point.outside)).toBe(true);
    const { container } = render(<PChart site={site} />);
    const chart = container.querySelector("[role=img]")!;
    await waitFor(() => expect(drawnMarkers(chart).length).toBe(site.points.length));
    expect(drawnMarkers(chart)).toEqual(
      site.points.map((point) => (point.outside ? "outsideLimits" : "readiness")),
    );
    chart.querySelectorAll("[data-marker]").forEach(expectVocabularyShape);
    const legend = container.querySelector("figcaption") as HTMLElement;
    expect(within(legend).getByText(markers.outsideLimits.words)).toBeTruthy();
    expect(drawnMarkers(legend)).toEqual(["readiness", "outsideLimits"]);
  });

  it("when map pins are drawn, then each severity has its own vocabulary shape, with the overdue clock and the fix-to-check mark", () => {
    const holder = document.createElement("div");
    holder.innerHTML = ["critical", "major", "minor"]
      .map((severity) =>
        actionPinHtml(
          buildAction({
            severity: severity as "critical",
            overdue: severity === "critical",
            state: severity === "major" ? "to_check" : "to_fix",
          }),
        ),
      )
      .join("");
    const pins = [...holder.querySelectorAll("[data-action-id]")];
    expect(pins.map((pin) => drawnMarkers(pin))).toEqual([
      ["critical", "overdue"],
      ["major"],
      ["minor"],
    ]);
    pins.forEach((pin) => pin.querySelectorAll("[data-marker]").forEach(expectVocabularyShape));
    expect(pins[1]!.querySelector('[data-mark="to_check"]')).not.toBeNull();
    // Severity shapes are not reused by the charts.
    const chartShapes = [markers.readiness, markers.smallSample, markers.outsideLimits].map(
      (marker) => marker.shape,
    );
    for (const severity of [markers.critical, markers.major, markers.minor]) {
      expect(chartShapes).not.toContain(severity.shape);
    }
  });
});

describe("doorway marks", () => {
  it("when every verdict and action state is drawn, then each has a doorway of its own, the verdicts and states never share one", () => {
    const drawn = Object.entries(markShapes).map(([meaning, shape]) => [
      meaning,
      JSON.stringify([shape.fill, shape.line ?? []]),
    ]);
    expect(new Set(drawn.map(([, d]) => d)).size).toBe(drawn.length);
    const verdictMarks = new Set<string>(verdicts);
    const stateMarks = new Set<string>(actionStates);
    expect(verdictMarks.size).toBe(verdicts.length);
    expect(stateMarks.size).toBe(actionStates.length);
    expect([...verdictMarks].filter((mark) => stateMarks.has(mark as never))).toEqual([]);
  });

  it("when a verdict badge or banner shows, then its words are the new ones and its doorway mark sits beside them", () => {
    const expected = {
      all_clear: "All clear",
      gaps_to_fix: "Gaps to fix",
      hold: "Hold until fixed",
    };
    for (const verdict of verdicts) {
      expect(verdictLabels[verdict]).toBe(expected[verdict]);
      const badge = render(<VerdictBadge verdict={verdict} />).container.firstElementChild!;
      expect(badge.textContent).toBe(expected[verdict]);
      expect(badge.querySelector("svg")!.getAttribute("data-mark")).toBe(verdict);
      const banner = render(<VerdictBanner verdict={verdict} />).container.firstElementChild!;
      expect(within(banner as HTMLElement).getByRole("heading").textContent).toBe(
        expected[verdict],
      );
      expect(banner.querySelector("svg")!.getAttribute("data-mark")).toBe(verdict);
    }
  });

  it("when an action state badge shows, then it says To fix, Being fixed, Fix to check or Done beside that state's mark", () => {
    const expected = {
      to_fix: "To fix",
      fixing: "Being fixed",
      to_check: "Fix to check",
      done: "Done",
    };
    for (const state of actionStates) {
      expect(actionStateLabels[state]).toBe(expected[state]);
      const badge = render(<StateBadge state={state} />).container.firstElementChild!;
      expect(badge.textContent).toBe(expected[state]);
      expect(badge.querySelector("svg")!.getAttribute("data-mark")).toBe(state);
    }
  });
});
