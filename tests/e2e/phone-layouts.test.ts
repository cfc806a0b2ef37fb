/// <reference lib="dom" />
import { mkdirSync } from "node:fs";
import path from "node:path";

import pg from "pg";
import type { Browser, BrowserContext, Page, Request } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phoneContext, signIn } from "../helpers/browser";

const password = "lintel-demo-2026";
const phones = [
  { width: 360, height: 800 },
  { width: 390, height: 844 },
] as const;

/** Demo places every role reads: the General, a floor with a plan, a space with audits. */
interface DemoPlaces {
  siteId: string;
  floorId: string;
  spaceId: string;
  auditId: string;
  actionId: string;
  personId: string;
}

/** A screen's address, as `src/config/paths.ts` spells it. */
type Screen = (places: DemoPlaces) => string;
const everyone: Screen[] = [
  () => "/",
  ({ siteId }) => `/sites/${siteId}`,
  ({ siteId, floorId }) => `/sites/${siteId}/floors/${floorId}`,
  ({ siteId }) => `/sites/${siteId}/actions`,
  ({ actionId }) => `/actions/${actionId}`,
  ({ spaceId }) => `/spaces/${spaceId}/audits`,
  ({ auditId }) => `/audits/${auditId}`,
  () => "/committee",
  ({ siteId }) => `/committee/sites/${siteId}`,
  () => "/account",
];

const roles: { email: string; screens: Screen[] }[] = [
  {
    email: "admin@example.org",
    screens: [
      ...everyone,
      () => "/sites/new",
      ({ siteId }) => `/sites/${siteId}/edit`,
      () => "/admin",
      () => "/admin/people",
      () => "/admin/people/invite",
      ({ personId }) => `/admin/people/${personId}`,
      () => "/admin/checklists",
      () => "/admin/sequences",
      () => "/admin/sequences?edit=standard-removal-1",
      () => "/admin/sign-in",
      () => "/admin/mail",
      () => "/admin/undelivered-mail",
    ],
  },
  {
    email: "auditor@example.org",
    screens: [...everyone, ({ siteId }) => `/sites/${siteId}/due`],
  },
  {
    email: "facilities.general@example.org",
    screens: [...everyone, () => "/actions"],
  },
  { email: "committee@example.org", screens: everyone },
];

/** Sums layout shifts from the first paint on, leaving out those that follow input. */
const layoutShiftCounter = `
  window.__layoutShift = 0;
  window.__shiftSources = [];
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries())
      if (!entry.hadRecentInput) {
        window.__layoutShift += entry.value;
        for (const source of entry.sources)
          window.__shiftSources.push(entry.value.toFixed(3) + " " + source.node?.nodeName + "." +
            String(source.node?.className ?? "").slice(0, 50) + " " + source.previousRect.y + "→" + source.currentRect.y);
      }
  }).observe({ type: "layout-shift", buffered: true });
`;

/**
 * Waits, after each call, until the page has had no request open for a moment: the network
 * idle of a navigation, also after moves inside the app, with a shorter quiet spell.
 */
function quietNetwork(page: Page, quietMs = 250, timeoutMs = 20_000): () => Promise<void> {
  let open = 0;
  let lastChange = Date.now();
  const pending = new Set<string>();
  page.on("request", (request) => {
    pending.add(request.url());
    open += 1;
    lastChange = Date.now();
  });
  const done = (request: Request) => {
    pending.delete(request.url());
    open -= 1;
    lastChange = Date.now();
  };
  page.on("requestfinished", done);
  page.on("requestfailed", done);
  return async () => {
    const deadline = Date.now() + timeoutMs;
    // Give the move a moment to send its first requests.
    await new Promise((resolve) => setTimeout(resolve, 50));
    while (open > 0 || Date.now() - lastChange < quietMs) {
      if (Date.now() > deadline)
        throw new Error(`${open} requests still open on ${page.url()}: ${[...pending].join(", ")}`);
      await new Promise((resolve) => setTimeout(resolve, 25));
    }
  };
}

/** What does not fit: the page's own width, and any entry of the bottom bar clipped or cut off. */
function misfits(page: Page, width: number): Promise<string[]> {
  return page.evaluate((width) => {
    const out: string[] = [];
    const pageWidth = document.documentElement.scrollWidth;
    if (pageWidth > width) {
      // Name the last things reaching past the edge, to say where to look.
      const culprits = [...document.querySelectorAll("body *")]
        .filter((element) => element.getBoundingClientRect().right > width + 0.5)
        .slice(-3)
        .map((element) => `${element.tagName.toLowerCase()}.${String(element.className)}`);
      out.push(`page ${pageWidth} px wide (${culprits.join(" | ")})`);
    }
    // Entries kept for the side rail are not displayed on a phone.
    const entries = [...document.querySelectorAll('nav[aria-label="Main"] a')].filter(
      (entry) => entry.getClientRects().length > 0,
    );
    if (entries.length > 5) out.push(`${entries.length} entries in the bottom bar`);
    for (const entry of entries) {
      const box = entry.getBoundingClientRect();
      if (box.left < 0 || box.right > width) out.push(`"${entry.textContent}" outside the bar`);
      for (const label of entry.querySelectorAll("span:not([aria-hidden])"))
        if (label.scrollWidth > label.clientWidth)
          out.push(`"${label.textContent}" cut off (${label.scrollWidth} > ${label.clientWidth})`);
    }
    return out;
  }, width);
}

describe("phone layouts", () => {
  let browser: Browser;
  let places: DemoPlaces;
  beforeAll(async () => {
    browser = await launchBrowser();
    const db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
    try {
      const { rows } = await db.query<DemoPlaces>(`
        select s.id as "siteId", f.id as "floorId", sp.id as "spaceId", a.id as "auditId",
               (select ca.id from corrective_actions ca where ca.site_id = s.id
                 order by ca.created_at limit 1) as "actionId",
               (select u.id from users u where u.email = 'auditor@example.org') as "personId"
          from sites s
          join floors f on f.site_id = s.id
          join spaces sp on sp.floor_id = f.id
          join audits a on a.space_id = sp.id and a.status = 'submitted'
         where s.name = 'Tamsin Bay General Hospital' and f.plan_image_id is not null
         order by a.submitted_at desc limit 1`);
      places = rows[0]!;
    } finally {
      await db.end();
    }
    expect(places?.actionId).toBeTruthy();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when every demo role opens each of its screens at 360 and 390 px, then no page is wider than the phone, the bottom bar shows every entry whole, and no page shifts while it loads", async () => {
    const shots = process.env.LINTEL_SHOTS_DIR;
    if (shots) mkdirSync(shots, { recursive: true });
    const report: string[] = [];
    const problems: string[] = [];
    const shifts: Record<string, number> = {};
    const contexts: BrowserContext[] = [];

    async function visitAll(
      role: (typeof roles)[number],
      phone: (typeof phones)[number],
      signedIn: BrowserContext,
    ): Promise<void> {
      const context = await phoneContext(browser, phone, problems, signedIn);
      contexts.push(context);
      await context.addInitScript(layoutShiftCounter);
      const page = await context.newPage();
      const whenQuiet = quietNetwork(page);
      for (const [index, screen] of role.screens.entries()) {
        const href = screen(places);
        if (index === 0) {
          // The first screen loads cold, as when the app is opened; the others as a person moves on.
          await page.goto(`${baseUrl()}${href}`);
        } else {
          await page.evaluate((href) => {
            document.querySelector("main h1")?.setAttribute("data-left", "");
            (window as unknown as { __layoutShift: number }).__layoutShift = 0;
            history.pushState(null, "", href);
            dispatchEvent(new PopStateEvent("popstate"));
          }, href);
        }
        await whenQuiet();
        await page
          .locator("main h1:not([data-left])")
          .first()
          .waitFor()
          .catch((error: Error) => {
            throw new Error(`${role.email} at ${phone.width} px on ${href}: ${error.message}`);
          });
        // Measured once the page has drawn what it loads (its "Loading …" notes gone), and after
        // whatever that settles, such as an address filled in with defaults.
        await page.waitForFunction(
          () =>
            ![...document.querySelectorAll('main [role="status"]')].some((status) =>
              /Loading/.test(status.textContent ?? ""),
            ),
        );
        await whenQuiet();
        for (const misfit of await misfits(page, phone.width))
          report.push(`${role.email} at ${phone.width} px on ${href}: ${misfit}`);
        const shift = await page.evaluate<number>("window.__layoutShift");
        shifts[`${role.email} at ${phone.width} px on ${href}`] = shift;
        if (process.env.LINTEL_LAYOUT_LOG)
          console.info(
            `${role.email} ${phone.width} ${href} shift ${shift.toFixed(3)}`,
            shift > 0 ? await page.evaluate("window.__shiftSources") : "",
          );
        if (shots && phone.width === 390) {
          const name = `${role.email.split("@")[0]}${href.replace(/\/[0-9a-f-]{36}/g, "-id").replace(/\//g, "-")}`;
          await page.screenshot({ path: path.join(shots, `${name}.png`) });
        }
      }
      await page.close();
    }

    try {
      // One sign-in per role; both widths start from its cookies and run side by side.
      await Promise.all(
        roles.map(async (role) => {
          const signedIn = await phoneContext(browser, phones[0], problems);
          contexts.push(signedIn);
          const page = await signedIn.newPage();
          await signIn(page, role.email, password);
          await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
          await page.close();
          await Promise.all(phones.map((phone) => visitAll(role, phone, signedIn)));
        }),
      );
    } finally {
      await Promise.all(contexts.map((context) => context.close()));
    }

    console.info(
      "layout shift on home:",
      Object.entries(shifts)
        .filter(([where]) => where.endsWith(" on /"))
        .map(([where, shift]) => `${where.replace(/ on \/$/, "")}: ${shift.toFixed(3)}`),
    );
    expect(report).toEqual([]);
    expect(Object.entries(shifts).filter(([, shift]) => shift > 0.1)).toEqual([]);
    expect(problems).toEqual([]);
  }, 150_000);

  it("when the auditor opens a space's QR link on a phone that has not opened Lintel's screens before, on a slow processor, and the audit's start takes a moment to arrive, then the audit screen does not shift while the status says it is sending and then that it arrived", async () => {
    const db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
    let spaceId: string;
    try {
      // A space with no audit open, far down the list so other tests' picks stay their own.
      const { rows } = await db.query<{ id: string }>(`
        select sp.id from spaces sp
          join floors f on f.id = sp.floor_id
          join sites s on s.id = f.site_id
         where s.name = 'Tamsin Bay General Hospital' and sp.retired_at is null
           and not exists (select 1 from audits a where a.space_id = sp.id and a.status = 'draft')
         order by sp.name desc limit 1`);
      spaceId = rows[0]!.id;
    } finally {
      await db.end();
    }
    const problems: string[] = [];
    const signedIn = await phoneContext(browser, phones[1], problems);
    try {
      const first = await signedIn.newPage();
      await signIn(first, "auditor@example.org", password);
      await first.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
      // A second context from the same cookies: the session, but none of the screens' files.
      const context = await phoneContext(browser, phones[1], problems, signedIn);
      try {
        await context.addInitScript(layoutShiftCounter);
        // The start reaches Lintel a second late, as over one bar of signal.
        await context.route(`**/api/audits/*`, async (route) => {
          if (route.request().method() === "PUT") await new Promise((r) => setTimeout(r, 1000));
          await route.continue();
        });
        const page = await context.newPage();
        // A mid-range phone's processor: the steps between the audit's arrival and the status
        // saying so are far enough apart to be drawn.
        const cdp = await context.newCDPSession(page);
        await cdp.send("Emulation.setCPUThrottlingRate", { rate: 4 });
        await page.goto(`${baseUrl()}/spaces/${spaceId}/audit`);
        await page.getByText(/Item 1 of/).waitFor();
        await page
          .getByRole("status")
          .filter({ hasText: "All changes arrived in Lintel" })
          .waitFor();
        await page.waitForTimeout(300);
        const shift = await page.evaluate<number>("window.__layoutShift");
        const sources = await page.evaluate<string[]>("window.__shiftSources");
        if (process.env.LINTEL_SHOTS_DIR)
          await page.screenshot({
            path: path.join(process.env.LINTEL_SHOTS_DIR, "auditor-qr-start-cold.png"),
          });
        expect(shift, sources.join("\n")).toBeLessThanOrEqual(0.1);
      } finally {
        await context.close();
      }
    } finally {
      await signedIn.close();
    }
    expect(problems).toEqual([]);
  });

  it("when words kept for screen readers sit at the far end of a wide table in a frame that scrolls sideways, then the page stays as wide as the phone", async () => {
    const context = await phoneContext(browser, phones[0]);
    try {
      const page = await context.newPage();
      await page.goto(`${baseUrl()}/sign-in`);
      await page.getByRole("heading", { level: 1 }).waitFor();
      // A frame with no position of its own, as a table frame is easily written.
      const width = await page.evaluate(() => {
        const frame = document.createElement("div");
        frame.style.overflowX = "auto";
        frame.innerHTML = `<table style="width: 1200px"><tr><td>Room</td>
          <td style="text-align: right">Due <span class="sr-only">in 3 days, overdue soon</span></td></tr></table>`;
        document.querySelector("main")!.append(frame);
        return document.documentElement.scrollWidth;
      });
      expect(width).toBeLessThanOrEqual(phones[0].width);
    } finally {
      await context.close();
    }
  });

  it("when the administrator works on a wide screen, then the side rail lists the admin pages one by one and no Admin entry", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    try {
      const page = await context.newPage();
      await signIn(page, "admin@example.org", password);
      await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
      const rail = page.getByRole("navigation", { name: "Main" });
      await rail.getByRole("link", { name: "Demo e-mails" }).waitFor();
      expect(await rail.getByRole("link").allInnerTexts()).toEqual([
        "Sites",
        "Committee",
        "People",
        "Checklists",
        "Observation steps",
        "Demo e-mails",
        "Account",
      ]);
      const shots = process.env.LINTEL_SHOTS_DIR;
      if (shots) await page.screenshot({ path: path.join(shots, "admin-wide-rail.png") });
    } finally {
      await context.close();
    }
  });
});
