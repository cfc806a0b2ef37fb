import { readdir, readFile } from "node:fs/promises";
import path from "node:path";

import { responseText } from "@shared/schemas/common";
import { mailboxMessageSchema, type MailboxMessage } from "@shared/schemas/people";

import type { AppDeps } from "../../lib/routes";
import { defineRoute } from "../../lib/routes";
import { mailIdsOfNetwork } from "./dev-mailbox.repository";

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

/** The outbox row a message was sent from: its Message-ID is `<outbox id@host>`. */
const outboxIdPattern = /^<([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})@[^>]*>$/i;

/** A file the catcher wrote: the message the page shows, and the Message-ID it arrived with. */
const caughtFileSchema = mailboxMessageSchema.extend({ messageId: responseText().nullable() });

/** How many of the newest files one request looks through. */
const filesScanned = 2000;

/**
 * The newest `limit` messages that Lintel queued for people of the network. The outbox row names
 * the person each e-mail was for, so a network's administrators read only what was sent to their
 * own people, even where another network's pending invitation shares an address.
 */
async function readMailbox(
  deps: AppDeps,
  networkId: string,
  limit: number,
): Promise<MailboxMessage[]> {
  const dir = deps.mailCatcherDir!;
  const files = (await readdir(dir).catch(() => [] as string[]))
    .filter((name) => name.endsWith(".json"))
    .sort()
    .reverse()
    .slice(0, filesScanned);
  const candidates: { id: string; message: MailboxMessage }[] = [];
  for (const file of files) {
    const raw = await readFile(path.join(dir, file), "utf8").catch(() => "");
    const parsed = caughtFileSchema.safeParse(parseJson(raw));
    if (!parsed.success) continue;
    const { messageId, ...message } = parsed.data;
    const id = outboxIdPattern.exec(messageId ?? "")?.[1]?.toLowerCase();
    if (id) candidates.push({ id, message });
  }
  const ours = await mailIdsOfNetwork(
    deps.db,
    networkId,
    candidates.map((candidate) => candidate.id),
  );
  return candidates
    .filter((candidate) => ours.has(candidate.id))
    .slice(0, limit)
    .map((candidate) => candidate.message);
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
      res.json({ messages: await readMailbox(deps, auth.user.networkId, 200) });
    },
  }),
];
