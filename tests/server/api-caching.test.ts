import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";

import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

describe("API replies and the browser's HTTP cache", () => {
  let siteId = "";
  let auditor: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    const networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
  });

  it("when a signed-in read answers, then the browser is told to keep none of it", async () => {
    for (const url of ["/api/auth/me", "/api/sites", `/api/sites/${siteId}`, "/api/health"]) {
      const response = await api(undefined, { cookie: auditor.cookie }).get(url);
      expect(response.status, url).toBe(200);
      expect(response.headers["cache-control"], url).toBe("no-store");
    }
  });

  it("when a request is refused before any route runs, then that reply is not kept either", async () => {
    const unparsable = await api(undefined, { cookie: auditor.cookie })
      .post("/api/auth/sign-in")
      .set("Content-Type", "application/json")
      .send("{ not json");
    expect(unparsable.status).toBe(400);
    expect(unparsable.headers["cache-control"]).toBe("no-store");

    const crossSite = await api(undefined, {
      cookie: auditor.cookie,
      origin: "https://elsewhere.example",
    }).post("/api/auth/sign-out");
    expect(crossSite.status).toBe(403);
    expect(crossSite.headers["cache-control"]).toBe("no-store");

    const unknown = await api(undefined, { cookie: auditor.cookie }).get("/api/no-such-thing");
    expect(unknown.status).toBe(404);
    expect(unknown.headers["cache-control"]).toBe("no-store");

    const signedOut = await api().get("/api/sites");
    expect(signedOut.status).toBe(401);
    expect(signedOut.headers["cache-control"]).toBe("no-store");
  });

  it("when an image's bytes are fetched, then they keep their own private, lasting cache header", async () => {
    const png = await sharp({
      create: { width: 32, height: 32, channels: 3, background: "#3a7" },
    })
      .png()
      .toBuffer();
    const uploaded = await api(undefined, { cookie: auditor.cookie })
      .post(`/api/sites/${siteId}/images`)
      .attach("photo", png, "plan.png");
    expect(uploaded.status).toBe(201);

    const served = await api(undefined, { cookie: auditor.cookie }).get(
      `/api/images/${uploaded.body.image.id}?variant=thumb`,
    );
    expect(served.status).toBe(200);
    expect(served.headers["cache-control"]).toBe("private, max-age=86400, immutable");
  });
});
