import { describe, expect, it } from "vitest";

import { answerBodySchema } from "@shared/schemas/audits";
import { signInBodySchema } from "@shared/schemas/auth";
import { spaceBodySchema } from "@shared/schemas/floors";
import { refusedCharacterIndex, text, timeZoneSchema } from "@shared/schemas/common";
import { createSiteBodySchema } from "@shared/schemas/site";

describe("shared input schemas", () => {
  it("when an e-mail has spaces and capitals, then it is trimmed and lower-cased", () => {
    const parsed = signInBodySchema.parse({ email: "  Imogen.Hale@Example.ORG ", password: "x" });
    expect(parsed.email).toBe("imogen.hale@example.org");
  });

  it("when a time zone is an IANA name, then it passes; offsets, abbreviations and inventions fail", () => {
    for (const zone of ["Europe/London", "America/Halifax", "Asia/Kolkata", "UTC"]) {
      expect(timeZoneSchema.safeParse(zone).success, zone).toBe(true);
    }
    for (const zone of ["GMT+1", "+01:00", "CEST", "Mars/Olympus", ""]) {
      expect(timeZoneSchema.safeParse(zone).success, zone).toBe(false);
    }
  });

  it("when a field is missing or of the wrong type, then the message says which", () => {
    const result = createSiteBodySchema.safeParse({
      address: 5,
      timeZone: "UTC",
      latitude: 0,
      longitude: 0,
    });
    expect(result.success).toBe(false);
    const messages = Object.fromEntries(
      result.error!.issues.map((issue) => [issue.path.join("."), issue.message]),
    );
    expect(messages).toEqual({ name: "Required.", address: "Must be text." });
  });
});

describe("validation messages are plain words", () => {
  const messagesOf = (result: { error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
    Object.fromEntries(
      // The first message for a field wins, as in the API's error envelope.
      [...(result.error?.issues ?? [])]
        .reverse()
        .map((issue) => [issue.path.join("."), issue.message]),
    );
  const answerId = "00000000-0000-4000-8000-000000000000";
  const outline = [
    [0, 0],
    [1, 0],
    [1, 1],
  ];

  it("when an id, an outline, a unit or a limit is wrong, then each field's message says what to do without code words", () => {
    const found = {
      ...messagesOf(answerBodySchema.safeParse({ id: "nope", outcome: "pass", unit: "furlong" })),
      ...messagesOf(answerBodySchema.safeParse({ id: answerId, outcome: null, count: 10_001 })),
      ...messagesOf(
        answerBodySchema.safeParse({ id: answerId, outcome: null, choice: "x".repeat(41) }),
      ),
      ...messagesOf(spaceBodySchema.safeParse({ zoneType: "lobby", name: "A", polygon: "x" })),
      ...messagesOf(
        spaceBodySchema.safeParse({ zoneType: "anteroom", name: "A", polygon: [[1], ...outline] }),
      ),
    };
    expect(found).toEqual({
      id: "This does not point to anything in Lintel; choose it again from the list.",
      unit: "Choose one of the units the form offers, such as Pa or inches of water.",
      count: "At most 10000.",
      choice: "At most 40 characters.",
      zoneType: "Choose a zone type.",
      polygon: "Draw the outline again: each corner needs a position across and down the plan.",
      "polygon.0": "Each corner is one position across the plan and one down it.",
    });
    for (const message of Object.values(found)) {
      expect(message).not.toMatch(
        /\b(id|uuid|enum|array|tuple|regex|expected)\b|\[x, y\]|Unknown|<=|>=/i,
      );
    }
  });
});

describe("request text refuses characters that cannot be stored", () => {
  const refused = {
    "NUL (U+0000)": "a\u0000b",
    "bell (U+0007)": "a\u0007b",
    "escape (U+001B)": "a\u001bb",
    "delete (U+007F)": "a\u007fb",
    "next line (U+0085)": "a\u0085b",
    "a lone high surrogate": "a\ud800b",
    "a lone low surrogate": "a\udc00b",
    "the noncharacter U+FFFF": "a\uffffb",
  };

  it("when a name holds a control character, then the name is refused with the position named", () => {
    for (const [what, value] of Object.entries(refused)) {
      const result = createSiteBodySchema.safeParse({ ...buildSiteBody(), name: value });
      expect(result.success, what).toBe(false);
      expect(result.error!.issues[0]).toMatchObject({
        path: ["name"],
        message: "Remove the invisible or control character at position 2; it cannot be stored.",
      });
    }
  });

  it("when text holds tabs, line breaks, emoji or right-to-left letters, then it is kept", () => {
    for (const value of ["line one\r\nline two\tend", "Mask on 😷", "חדר בידוד", "غرفة العزل"]) {
      expect(text().safeParse(value)).toEqual({ success: true, data: value });
    }
  });

  it("when an e-mail or a password holds NUL, then each is refused", () => {
    expect(
      signInBodySchema.safeParse({ email: "a\u0000@example.org", password: "x" }).success,
    ).toBe(false);
    expect(
      signInBodySchema.safeParse({ email: "a@example.org", password: "x\u0000" }).success,
    ).toBe(false);
    expect(refusedCharacterIndex("ok\u0000")).toBe(2);
    expect(refusedCharacterIndex("ok 😷")).toBe(-1);
  });
});

function buildSiteBody() {
  return { name: "Site", address: "1 Row", timeZone: "UTC", latitude: 0, longitude: 0 };
}
