import { readdir, readFile } from "node:fs/promises";
import path from "node:path";

import { mailboxMessageSchema, type MailboxMessage } from "@shared/schemas/people";

import type { Env } from "../../env";
import { notFound } from "../../lib/app-error";
import { defineRoute } from "../../lib/routes";

/** The local mail catcher's inbox is shown only on demo installs that run one. */
export const devMailboxEnabled = (env: Env) =>
  env.LINTEL_DEMO === "1" && Boolean(env.LINTEL_DEV_MAILBOX_DIR);

async function readMailbox(dir: string, limit: number): Promise<MailboxMessage[]> {
  const files = (await readdir(dir).catch(() => [] as string[]))
    .filter((name) => name.endsWith(".json"))
    .sort()
    .reverse();
  const messages: MailboxMessage[] = [];
  for (const file of files.slice(0, limit)) {
    const parsed = mailboxMessageSchema.safeParse(
      JSON.parse(await readFile(path.join(dir, file), "utf8")),
    );
    if (parsed.success) messages.push(parsed.data);
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
      res.json({ demoMailbox: devMailboxEnabled(deps.env) });
    },
  }),
  defineRoute({
    method: "get",
    path: "/dev/mailbox",
    summary: "Mail received by the local mail catcher (demo installs only)",
    access: { kind: "network", permission: "read:dev-mailbox:network" },
    async handle({ res, deps }) {
      if (!devMailboxEnabled(deps.env)) throw notFound("The demo mailbox");
      res.json({ messages: await readMailbox(deps.env.LINTEL_DEV_MAILBOX_DIR!, 200) });
    },
  }),
];
