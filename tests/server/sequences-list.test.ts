import { describe, expect, it } from "vitest";

import { insertNetwork } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });
const db = () => testApp().deps.db;

interface Listed {
  key: string;
  published: { version: number; title: string } | null;
  draft: { version: number } | null;
}

describe("the list of sequences", () => {
  it("when a sequence is published again, then the list shows its newest published version in its old place", async () => {
    const networkId = (await insertNetwork(db())).id;
    const admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
    const before = await as(admin).get("/api/sequences");
    expect(before.status).toBe(200);
    const order = (before.body.sequences as Listed[]).map((entry) => entry.key);

    for (const title of ["Removing PPE, our order", "Removing PPE, our order again"]) {
      const draft = await as(admin)
        .put("/api/sequences/standard-removal-1/draft")
        .send({
          title,
          kind: "removal",
          steps: [{ key: "gloves", text: "Gloves off", handHygiene: false, watchFor: [] }],
        });
      expect(draft.status).toBe(200);
      expect((await as(admin).post("/api/sequences/standard-removal-1/publish")).status).toBe(200);
    }

    const after = await as(admin).get("/api/sequences");
    const listed = after.body.sequences as Listed[];
    expect(listed.map((entry) => entry.key)).toEqual(order);
    expect(listed.find((entry) => entry.key === "standard-removal-1")).toMatchObject({
      published: { version: 3, title: "Removing PPE, our order again" },
      draft: null,
    });
  });
});
