import type { Page } from "playwright-core";

/**
 * Answers the doffing-area item on screen as the demo's offline audits do: the dirty chair fails
 * with a note and a photo, the counts and choices get a valid answer, everything else passes;
 * then "Next" (which on the last item opens the review).
 */
export async function answerDoffingItem(
  page: Page,
  failure: { note: string; photo: { name: string; buffer: Buffer } },
): Promise<void> {
  const text = (await page.getByRole("heading", { level: 2 }).first().textContent()) ?? "";
  if (text.startsWith("Dirty chair present")) {
    await page.getByRole("button", { name: "Fail", exact: true }).click();
    await page.getByLabel("Note").fill(failure.note);
    await page.getByLabel("Add photo").setInputFiles({ ...failure.photo, mimeType: "image/png" });
    await page.getByRole("list", { name: "Photos of this item" }).waitFor();
  } else if (text.startsWith("Number of working")) {
    await page.getByLabel("Count").fill("2");
  } else if (text.startsWith("Mirror or observer")) {
    await page.getByRole("button", { name: "Mirror", exact: true }).click();
  } else {
    await page.getByRole("button", { name: "Pass", exact: true }).click();
  }
  await page.getByRole("button", { name: "Next", exact: true }).click();
}
