import { formatInZone } from "@shared/calc/due";

import { mailLayout } from "../../lib/mail-layout";
import type { NewMail } from "../../outbox/outbox.repository";

/** What an alarm e-mail says about the room and the alarm. */
export interface AlarmMailFacts {
  to: string;
  name: string;
  kind: "out_of_range" | "no_readings";
  roomName: string;
  siteName: string;
  timeZone: string;
  /** The first reading out of range, or the last reading before the silence. */
  since: Date;
  /** Out of range only: the worst reading so far, in the monitor's unit. */
  worst: { value: number; unit: "Pa" | "inH2O" } | null;
  /** The room's threshold in words, e.g. "−2.5 Pa or lower". */
  thresholdWords: string;
  link: string;
}

const footnote =
  "You receive this because you are on this site's list for room-pressure alarms in Lintel. " +
  "Lintel is not a life-safety alarm system and does not replace the building's own alarms.";

export function formatPressure(value: number, unit: "Pa" | "inH2O"): string {
  const sign = value < 0 ? "−" : "";
  const figure = Math.abs(value);
  return unit === "Pa" ? `${sign}${figure.toFixed(1)} Pa` : `${sign}${figure.toFixed(3)} in. w.c.`;
}

/** "1 h 5 min", "12 min", "40 s". */
export function formatDuration(ms: number): string {
  const totalSeconds = Math.max(0, Math.round(ms / 1000));
  if (totalSeconds < 60) return `${totalSeconds} s`;
  const minutes = Math.round(totalSeconds / 60);
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  const rest = minutes % 60;
  return rest === 0 ? `${hours} h` : `${hours} h ${rest} min`;
}

function alarmMail(
  topic: string,
  facts: AlarmMailFacts,
  subject: string,
  lines: string[],
): NewMail {
  const button = "Open the room";
  const paragraphs = [`Hello ${facts.name},`, ...lines];
  return {
    topic,
    to: facts.to,
    subject,
    text: `${paragraphs.join("\n\n")}\n\n${button}: ${facts.link}\n\n${footnote}\n`,
    html: mailLayout(subject, paragraphs, { label: button, href: facts.link }, footnote),
  };
}

export function alarmStartedMail(facts: AlarmMailFacts): NewMail {
  const since = formatInZone(facts.since, facts.timeZone);
  if (facts.kind === "no_readings")
    return alarmMail(
      "pressure_alarm_started",
      facts,
      `No pressure readings: ${facts.roomName}, ${facts.siteName}`,
      [
        `The pressure monitor of ${facts.roomName} at ${facts.siteName} has sent no reading since ${since} (the site's time).`,
        "Until it reports again, Lintel cannot tell whether the room is negative. Check the monitor and the room.",
      ],
    );
  return alarmMail(
    "pressure_alarm_started",
    facts,
    `Room not negative: ${facts.roomName}, ${facts.siteName}`,
    [
      `${facts.roomName} at ${facts.siteName} has been out of range since ${since} (the site's time), longer than the site's grace.`,
      facts.worst
        ? `Its worst reading so far is ${formatPressure(facts.worst.value, facts.worst.unit)}; the room needs ${facts.thresholdWords}.`
        : `The room needs ${facts.thresholdWords}.`,
      "Check the door, the exhaust and the monitor. You will get one more e-mail when it ends.",
    ],
  );
}

export function alarmEndedMail(
  facts: AlarmMailFacts & { endedAt: Date; endedBy: "recovered" | "readings_stopped" | null },
): NewMail {
  const since = formatInZone(facts.since, facts.timeZone);
  const ended = formatInZone(facts.endedAt, facts.timeZone);
  const duration = formatDuration(facts.endedAt.getTime() - facts.since.getTime());
  if (facts.kind === "no_readings")
    return alarmMail(
      "pressure_alarm_ended",
      facts,
      `Pressure readings back: ${facts.roomName}, ${facts.siteName}`,
      [
        `The pressure monitor of ${facts.roomName} at ${facts.siteName} reported again at ${ended} (the site's time), after ${duration} without a reading (since ${since}).`,
      ],
    );
  return alarmMail(
    "pressure_alarm_ended",
    facts,
    `Room pressure back in range: ${facts.roomName}, ${facts.siteName}`,
    [
      facts.endedBy === "readings_stopped"
        ? `${facts.roomName} at ${facts.siteName} was out of range from ${since} until its monitor stopped reporting at ${ended} (the site's time): ${duration}.`
        : `${facts.roomName} at ${facts.siteName} was out of range from ${since} and back in range at ${ended} (the site's time): ${duration}.`,
      facts.worst
        ? `Its worst reading was ${formatPressure(facts.worst.value, facts.worst.unit)}; the room needs ${facts.thresholdWords}.`
        : `The room needs ${facts.thresholdWords}.`,
    ],
  );
}

/** One room in a digest of silences that started (or ended) together at a site. */
export interface SilenceDigestRoom {
  roomName: string;
  /** The room's last reading before the silence. */
  since: Date;
  /** When it reported again (a digest of ends). */
  endedAt: Date | null;
}

/**
 * Several rooms of one site falling silent (or reporting again) in the same round: usually the
 * building's gateway or network, not each monitor. One e-mail lists them all instead of one per
 * room, so a recipient can see at once that it is one fault.
 */
export function silenceDigestMail(facts: {
  to: string;
  name: string;
  kind: "started" | "ended";
  siteName: string;
  timeZone: string;
  rooms: SilenceDigestRoom[];
  link: string;
}): NewMail {
  const count = `${facts.rooms.length} ${facts.rooms.length === 1 ? "room" : "rooms"}`;
  const started = facts.kind === "started";
  const subject = started
    ? `No pressure readings: ${count}, ${facts.siteName}`
    : `Pressure readings back: ${count}, ${facts.siteName}`;
  const lines = facts.rooms.map((room) =>
    started
      ? `${room.roomName}: no reading since ${formatInZone(room.since, facts.timeZone)}`
      : `${room.roomName}: reported again at ${formatInZone(room.endedAt!, facts.timeZone)}, after ${formatDuration(room.endedAt!.getTime() - room.since.getTime())} without a reading`,
  );
  const paragraphs = [
    `Hello ${facts.name},`,
    started
      ? `The pressure monitors of ${count} at ${facts.siteName} have sent nothing for 10 minutes or more (times are the site's). Many rooms at once usually means the building's gateway or its network, not each monitor.`
      : `The pressure monitors of ${count} at ${facts.siteName} are reporting again (times are the site's).`,
    ...lines,
    started
      ? "Until they report again, Lintel cannot tell whether these rooms are negative. Check the gateway, then the rooms."
      : "Each room's page has its readings and its alarm log.",
  ];
  const button = "Open the site";
  return {
    topic: started ? "pressure_alarm_started" : "pressure_alarm_ended",
    to: facts.to,
    subject,
    text: `${paragraphs.join("\n\n")}\n\n${button}: ${facts.link}\n\n${footnote}\n`,
    html: mailLayout(subject, paragraphs, { label: button, href: facts.link }, footnote),
  };
}
