import { mailParamsSchema } from "@shared/schemas/mail";
import { emptyBodySchema } from "@shared/schemas/people";

import { defineRoute, type NetworkAccess } from "../../lib/routes";
import * as mail from "./mail.service";

const networkAdministrators: NetworkAccess = { kind: "network", permission: "resend:mail:network" };

export const mailRoutes = [
  defineRoute({
    method: "get",
    path: "/mail/undelivered",
    summary: "E-mail to the network's people that may not have arrived (uncertain or failed)",
    access: networkAdministrators,
    async handle({ res, deps, auth }) {
      res.json({ mail: await mail.listUndelivered(deps, auth) });
    },
  }),
  defineRoute({
    method: "post",
    path: "/mail/:mailId/resend",
    summary: "Send an uncertain or failed e-mail again (once, however often it is asked)",
    access: networkAdministrators,
    params: mailParamsSchema,
    body: emptyBodySchema,
    async handle({ res, deps, auth, params, actor }) {
      res.json(await mail.resend(deps, auth, params.mailId, actor));
    },
  }),
];
