import { readdir, readFile } from "node:fs/promises";
import path from "node:path";

import { mailboxMessageSchema, type MailboxMessage } from "@shared/schemas/people";

import type { AppDeps } from "../../lib/routes";
import { defineRoute } from "../../lib/routes";
import { addressesOfNetwork } from "./dev-mailbox.repository";

/** The catcher's inbox exists only where the process running this app also runs the catcher. */
const mailCatcherRuns = (deps: AppDeps) => deps.mailCatcherDir !== null;

/** A file the catcher is still writing reads as nothing. */
function parseJson(raw: string): unknown {
  try {
    return JSON.parse(raw);
  } catch {
    return null;
  }
}

/**
 * The newest `limit` messages whose every recipient is one of `addresses`. An e-mail address
 * belongs to one person, and a person to one network, so a network's administrators read only
 * what was sent to their own people.
 */
async function readMailbox(
  dir: string,
  addresses: ReadonlySet<string>,
  limit: number,
): Promise<MailboxMessage[]> {
  const files = (await readdir(dir).catch(() => [] as string[]))
    .filter((name) => name.endsWith(".json"))
    .sort()
    .reverse();
  const messages: MailboxMessage[] = [];
  for (const file of files) {
    if (messages.length >= limit) break;
    const raw = await readFile(path.join(dir, file), "utf8").catch(() => "");
    const parsed = mailboxMessageSchema.safeParse(parseJson(raw));
    if (!parsed.success) continue;
    const { to } = parsed.data;
    if (to.length > 0 && to.every((address) => addresses.has(address.toLowerCase())))
      messages.push(parsed.data);
  }
  return messages;
}

export const devMailboxRoutes = [
  defineRoute({
    method: "get",
    path: "/app-config",
    summary: "What this install offers (demo mailbox)",
    access: { kind: "public" },
    handle({ res, deps }) {
      res.json({ demoMailbox: mailCatcherRuns(deps) });
    },
  }),
  defineRoute({
    method: "get",
    path: "/dev/mailbox",
    summary: "Mail the local mail catcher received for the caller's network (only where it runs)",
    access: { kind: "network", permission: "read:dev-mailbox:network" },
    mountedWhen: mailCatcherRuns,
    async handle({ res, deps, auth }) {
      const addresses = await addressesOfNetwork(deps.db, auth!.user.networkId);
      res.json({ messages: await readMailbox(deps.mailCatcherDir!, addresses, 200) });
    },
  }),
];
