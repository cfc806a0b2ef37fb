import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import { changeLog } from "../../server/db/schema/index";
import { recordChange } from "../../server/lib/change-log";
import { testApp } from "../helpers/app";

describe("change log", () => {
  it("when a row is written, then the database refuses to update, delete or truncate it", async () => {
    const { db } = testApp().deps;
    const entityId = crypto.randomUUID();
    await recordChange(
      db,
      { userId: null, requestId: "test" },
      { action: "probe.written", entity: "probe", entityId, siteId: null, after: { n: 1 } },
    );

    // drizzle wraps the database's error; the refusal is its cause.
    const refused = {
      cause: expect.objectContaining({ message: expect.stringMatching(/append-only/) }),
    };
    await expect(
      db.update(changeLog).set({ reason: "rewritten" }).where(eq(changeLog.entityId, entityId)),
    ).rejects.toMatchObject(refused);
    await expect(
      db.delete(changeLog).where(eq(changeLog.entityId, entityId)),
    ).rejects.toMatchObject(refused);
    await expect(db.execute(sql`truncate change_log`)).rejects.toMatchObject(refused);

    const rows = await db.select().from(changeLog).where(eq(changeLog.entityId, entityId));
    expect(rows).toHaveLength(1);
    expect(rows[0]!.reason).toBeNull();
  });

  it("when the change it records is rolled back, then the log row is rolled back too", async () => {
    const { db } = testApp().deps;
    const entityId = crypto.randomUUID();
    await expect(
      db.transaction(async (tx) => {
        await recordChange(
          tx,
          { userId: null, requestId: "test" },
          { action: "probe.written", entity: "probe", entityId, siteId: null },
        );
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    expect(await db.select().from(changeLog).where(eq(changeLog.entityId, entityId))).toHaveLength(
      0,
    );
  });
});
