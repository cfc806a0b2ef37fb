import { describe, expect, it } from "vitest";

import { signInBodySchema } from "@shared/schemas/auth";
import { timeZoneSchema } from "@shared/schemas/common";
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
