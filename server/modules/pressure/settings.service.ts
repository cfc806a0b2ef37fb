import {
  defaultExcursionPolicy,
  excursionPolicy,
  type ExcursionPolicy,
} from "@shared/calc/pressure-excursions";
import type {
  PressureSettingsBody,
  PressureSettingsResponse,
} from "@shared/schemas/pressure-alarms";

import type { Database, DbOrTx } from "../../db/client";
import { AppError } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import * as repo from "./alarms.repository";

const defaultGraceSeconds = defaultExcursionPolicy.graceMs / 1000;
const defaultDoorGraceSeconds = defaultExcursionPolicy.doorGraceMs / 1000;
const defaultActionLimitMinutes = defaultExcursionPolicy.actionLimitMs / 60_000;

/** Whom an alarm of the site e-mails: the chosen people, or its facilities leads and auditors. */
export async function alarmRecipients(db: DbOrTx, siteId: string): Promise<repo.Person[]> {
  const settings = await repo.settingsOf(db, siteId);
  const people = await repo.peopleOfSite(db, siteId);
  if (!settings?.recipientsChosen)
    return people.filter(
      (person) => person.roles.includes("facilities_lead") || person.roles.includes("auditor"),
    );
  const chosen = new Set(await repo.chosenRecipientIds(db, siteId));
  return people.filter((person) => chosen.has(person.id));
}

/** The site's policy: its own graces and action limit over Lintel's defaults, the room's threshold. */
export function sitePolicy(settings: {
  graceSeconds: number | null;
  doorGraceSeconds: number | null;
  actionLimitMinutes: number | null;
  thresholdPa?: number | null;
}): ExcursionPolicy {
  const graceMs = (settings.graceSeconds ?? defaultGraceSeconds) * 1000;
  const doorGraceMs = Math.max(
    graceMs,
    (settings.doorGraceSeconds ?? defaultDoorGraceSeconds) * 1000,
  );
  return excursionPolicy({
    graceMs,
    doorGraceMs,
    actionLimitMs: (settings.actionLimitMinutes ?? defaultActionLimitMinutes) * 60_000,
    ...(settings.thresholdPa != null
      ? { threshold: { op: "<=" as const, value: settings.thresholdPa } }
      : {}),
  });
}

export async function pressureSettings(
  db: DbOrTx,
  siteId: string,
): Promise<PressureSettingsResponse> {
  const settings = await repo.settingsOf(db, siteId);
  const people = await repo.peopleOfSite(db, siteId);
  const notified = await alarmRecipients(db, siteId);
  const chosen = settings?.recipientsChosen ? await repo.chosenRecipientIds(db, siteId) : null;
  return {
    graceSeconds: settings?.graceSeconds ?? null,
    doorGraceSeconds: settings?.doorGraceSeconds ?? null,
    actionLimitMinutes: settings?.actionLimitMinutes ?? null,
    effective: {
      graceSeconds: settings?.graceSeconds ?? defaultGraceSeconds,
      doorGraceSeconds: Math.max(
        settings?.graceSeconds ?? defaultGraceSeconds,
        settings?.doorGraceSeconds ?? defaultDoorGraceSeconds,
      ),
      actionLimitMinutes: settings?.actionLimitMinutes ?? defaultActionLimitMinutes,
    },
    recipients: chosen ?? "default",
    notified: notified.map(({ id, name }) => ({ id, name })),
    people: people.map(({ id, name, roles }) => ({ id, name, roles })),
  };
}

/** Saves the site's graces, action limit and recipients, with a change-log row, in one transaction. */
export async function setPressureSettings(
  db: Database,
  siteId: string,
  body: PressureSettingsBody,
  actor: Actor,
): Promise<PressureSettingsResponse> {
  await db.transaction(async (tx) => {
    const before = await pressureSettings(tx, siteId);
    if (Array.isArray(body.recipients)) {
      const people = new Set((await repo.peopleOfSite(tx, siteId)).map((person) => person.id));
      const index = body.recipients.findIndex((id) => !people.has(id));
      if (index >= 0) {
        const message = "This person holds no role at this site; choose from the site's people.";
        throw new AppError("validation_failed", 400, message, {
          fields: { [`recipients.${index}`]: message },
        });
      }
    }
    const chosen = body.recipients !== "default";
    await repo.saveSettings(tx, siteId, {
      graceSeconds: body.graceSeconds,
      doorGraceSeconds: body.doorGraceSeconds,
      actionLimitMinutes: body.actionLimitMinutes,
      recipientsChosen: chosen,
      updatedBy: actor.userId,
    });
    await repo.replaceRecipients(tx, siteId, chosen ? (body.recipients as string[]) : []);
    await recordChange(tx, actor, {
      action: "site.pressure_settings_set",
      entity: "site",
      entityId: siteId,
      siteId,
      before: {
        graceSeconds: before.graceSeconds,
        doorGraceSeconds: before.doorGraceSeconds,
        actionLimitMinutes: before.actionLimitMinutes,
        recipients: before.recipients,
      },
      after: body,
    });
  });
  return pressureSettings(db, siteId);
}
