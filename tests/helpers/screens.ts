import { mkdirSync } from "node:fs";
import path from "node:path";

import type pg from "pg";
import type { Page } from "playwright-core";

/**
 * Saves a picture of the screen when LINTEL_SHOTS_DIR names a folder, for reviewing screens by
 * eye (the README's "every screen at 390 px"); the whole page with `fullPage`.
 */
export async function shot(page: Page, name: string, options: { fullPage?: boolean } = {}) {
  const dir = process.env.LINTEL_SHOTS_DIR;
  if (!dir) return;
  mkdirSync(dir, { recursive: true });
  await page.screenshot({
    path: path.join(dir, `${name}.png`),
    fullPage: options.fullPage ?? false,
  });
}

/** How wide the page is, in CSS pixels: never more than the phone. */
export function pageWidth(page: Page): Promise<number> {
  return page.evaluate(
    () =>
      (globalThis as unknown as { document: { documentElement: { scrollWidth: number } } }).document
        .documentElement.scrollWidth,
  );
}

/**
 * A network of its own with one network-wide administrator, so a test that edits network-wide
 * things (checklists, sequences) leaves the demo network as other tests expect it. The
 * administrator signs in with the demo password (their hash is copied from the demo administrator).
 */
export async function networkWithAdministrator(
  db: pg.Client,
): Promise<{ networkId: string; userId: string; email: string }> {
  const email = `admin-${crypto.randomUUID().slice(0, 8)}@example.org`;
  const { rows } = await db.query<{ network_id: string; user_id: string }>(
    `with n as (insert into networks (name) values ($1) returning id),
          u as (insert into users (network_id, email, display_name, password_hash)
                select n.id, $2, 'Rowan Hale',
                       (select password_hash from users where email = 'admin@example.org')
                  from n returning id, network_id)
     select network_id, id as user_id from u`,
    [`Harbour Health ${email}`, email],
  );
  const { network_id: networkId, user_id: userId } = rows[0]!;
  await db.query(
    `insert into role_grants (user_id, role, site_id) values ($1, 'administrator', null)`,
    [userId],
  );
  return { networkId, userId, email };
}
