import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import { count, eq } from "drizzle-orm";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { startS3Fake } from "../../scripts/lib/s3-fake";
import { images, pendingObjects } from "../../server/db/schema/index";
import { reconcileStorage } from "../../server/lib/images";
import { insertNetwork, insertSite } from "../factories/records";
import { jpegWithGps, largeRandomFile, sidewaysJpeg } from "../factories/images";
import { api, createTestApp, testApp, type TestApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { createIsolatedDatabase } from "../helpers/isolated-database";

async function objectKeys(endpoint: string, prefix: string): Promise<string[]> {
  const client = new S3Client({
    region: "us-east-1",
    endpoint,
    forcePathStyle: true,
    credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
  });
  try {
    const result = await client.send(
      new ListObjectsV2Command({ Bucket: "lintel-test", Prefix: prefix }),
    );
    return (result.Contents ?? []).map((item) => item.Key!);
  } finally {
    client.destroy();
  }
}

describe("image uploads", () => {
  let networkId = "";
  let siteId = "";
  let otherSiteId = "";
  let auditor: SignedInPerson;
  let outsider: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    otherSiteId = (await insertSite(db, networkId)).id;
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    outsider = await signInAs(networkId, [{ role: "auditor", siteId: otherSiteId }]);
  });

  const upload = (person: SignedInPerson, file: Buffer, name = "photo.jpg", site = siteId) =>
    api(undefined, { cookie: person.cookie })
      .post(`/api/sites/${site}/images`)
      .attach("photo", file, name);

  it("when a photo with GPS and camera metadata is uploaded, then what is served carries none of it", async () => {
    const original = await jpegWithGps();
    expect((await sharp(original).metadata()).exif?.toString("latin1")).toContain("WardCam");

    const response = await upload(auditor, original);
    expect(response.status).toBe(201);
    expect(response.body.image).toMatchObject({ width: 640, height: 480, duplicate: false });

    for (const variant of ["display", "thumb"]) {
      const served = await api(undefined, { cookie: auditor.cookie })
        .get(`/api/images/${response.body.image.id}?variant=${variant}`)
        .buffer(true)
        .parse((res, done) => {
          const chunks: Buffer[] = [];
          res.on("data", (chunk: Buffer) => chunks.push(chunk));
          res.on("end", () => done(null, Buffer.concat(chunks)));
        });
      expect(served.status).toBe(200);
      expect(served.headers["content-type"]).toBe("image/webp");
      expect(served.headers["cache-control"]).toContain("private");
      const meta = await sharp(served.body as Buffer).metadata();
      expect(meta.exif, variant).toBeUndefined();
      expect(meta.xmp, variant).toBeUndefined();
      expect(meta.icc, variant).toBeUndefined();
      expect((served.body as Buffer).toString("latin1")).not.toContain("WardCam");
    }
  });

  it("when a photo is stored sideways with an orientation tag, then it is turned upright", async () => {
    const response = await upload(auditor, await sidewaysJpeg());
    expect(response.status).toBe(201);
    expect(response.body.image).toMatchObject({ width: 100, height: 300 });
  });

  it("when the same photo is uploaded twice, then one image and one pair of objects are stored", async () => {
    const photo = await jpegWithGps({ colour: "#3a8a4a" });
    const first = await upload(auditor, photo, "first.jpg");
    const second = await upload(auditor, photo, "renamed-copy.jpg");
    expect(first.status).toBe(201);
    expect(second.status).toBe(200);
    expect(second.body.image).toMatchObject({ id: first.body.image.id, duplicate: true });
    const [rows] = await testApp()
      .deps.db.select({ n: count() })
      .from(images)
      .where(eq(images.sha256, first.body.image.sha256));
    expect(rows!.n).toBe(1);
    const keys = await objectKeys(process.env.S3_ENDPOINT!, `sites/${siteId}/images/`);
    const [row] = await testApp()
      .deps.db.select()
      .from(images)
      .where(eq(images.id, first.body.image.id));
    expect(
      keys.filter((key) => key.startsWith(row!.displayKey.replace("/display.webp", ""))),
    ).toHaveLength(2);
  });

  it("when a text file is named .jpg, then 415 names the accepted types and nothing is stored", async () => {
    const before = await testApp().deps.db.select({ n: count() }).from(images);
    const response = await upload(
      auditor,
      Buffer.from("this is not a picture at all\n".repeat(20)),
      "evidence.jpg",
    );
    expect(response.status).toBe(415);
    expect(response.body.error.message).toMatch(/JPEG, PNG or WebP/);
    expect(response.body.error.fields).toHaveProperty("photo");
    expect(await testApp().deps.db.select({ n: count() }).from(images)).toEqual(before);
  });

  it("when a GIF is sent with a .png name, then 415", async () => {
    const gif = await sharp({ create: { width: 10, height: 10, channels: 3, background: "#000" } })
      .gif()
      .toBuffer();
    expect((await upload(auditor, gif, "plan.png")).status).toBe(415);
  });

  it("when the upload is 20 MB, then 413 naming the field", async () => {
    const response = await upload(auditor, largeRandomFile(20 * 1024 * 1024), "huge.jpg");
    expect(response.status).toBe(413);
    expect(response.body.error.fields).toHaveProperty("photo");
  });

  it("when no file is attached, then 400 naming the field", async () => {
    const response = await api(undefined, { cookie: auditor.cookie })
      .post(`/api/sites/${siteId}/images`)
      .field("note", "x");
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toHaveProperty("photo");
  });

  it("when a person from another site asks for the image, then 404; signed out, 401", async () => {
    const response = await upload(auditor, await jpegWithGps({ colour: "#445566" }));
    const id = response.body.image.id;
    expect(
      (await api(undefined, { cookie: outsider.cookie }).get(`/api/images/${id}`)).status,
    ).toBe(404);
    expect((await api().get(`/api/images/${id}`)).status).toBe(401);
    expect(
      (await upload(outsider, await jpegWithGps({ colour: "#556677" }), "x.jpg", siteId)).status,
    ).toBe(404);
  });

  it("when a committee member uploads, then 403 (they read, they do not add)", async () => {
    const committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
    expect((await upload(committee, await jpegWithGps({ colour: "#667788" }))).status).toBe(403);
  });
});

describe("image storage outages", () => {
  let app: TestApp;
  let s3Dir = "";
  let s3: Awaited<ReturnType<typeof startS3Fake>>;
  let auditor: SignedInPerson;
  let siteId = "";

  beforeAll(async () => {
    s3Dir = mkdtempSync(path.join(os.tmpdir(), "lintel-s3-outage-"));
    s3 = await startS3Fake({ dir: s3Dir });
    // A database and a store of its own: the reconciler here must see only this file's uploads.
    app = createTestApp({ S3_ENDPOINT: s3.endpoint, DATABASE_URL: await createIsolatedDatabase() });
    await app.deps.storage.ensureBucket();
    const networkId = (await insertNetwork(app.deps.db)).id;
    siteId = (await insertSite(app.deps.db, networkId)).id;
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }], { app });
  });
  afterAll(async () => {
    await s3.stop();
    await app.database.close();
    rmSync(s3Dir, { recursive: true, force: true });
  });

  it("when the object store is down, then 503 with a clear message and no image row", async () => {
    await s3.stop();
    const response = await api(app.app, { cookie: auditor.cookie })
      .post(`/api/sites/${siteId}/images`)
      .attach("photo", await jpegWithGps({ colour: "#778899" }), "down.jpg");
    expect(response.status).toBe(503);
    expect(response.body.error.code).toBe("unavailable");
    const [rows] = await app.deps.db
      .select({ n: count() })
      .from(images)
      .where(eq(images.siteId, siteId));
    expect(rows!.n).toBe(0);
    await s3.start();
  });

  it("when the store fails after the first object is written, then that object is removed and no row is left", async () => {
    const realPut = app.deps.storage.put;
    let puts = 0;
    // The store goes away between the display copy and the thumbnail.
    app.deps.storage.put = async (key, body, type) => {
      puts += 1;
      if (puts === 2) await s3.stop();
      return realPut(key, body, type);
    };
    try {
      const response = await api(app.app, { cookie: auditor.cookie })
        .post(`/api/sites/${siteId}/images`)
        .attach("photo", await jpegWithGps({ colour: "#8899aa" }), "midway.jpg");
      expect(response.status).toBe(503);
    } finally {
      app.deps.storage.put = realPut;
      await s3.start();
    }
    const [rows] = await app.deps.db
      .select({ n: count() })
      .from(images)
      .where(eq(images.siteId, siteId));
    expect(rows!.n).toBe(0);
    // The clean-up ran while the store was down, so the display copy is still there, noted as
    // pending; the reconciler removes it once the store answers again.
    expect(await objectKeys(s3.endpoint, `sites/${siteId}/`)).toHaveLength(1);
    expect(await reconcileStorage(app.deps, 0)).toBeGreaterThanOrEqual(1);
    expect(await objectKeys(s3.endpoint, `sites/${siteId}/`)).toEqual([]);
    expect(await app.deps.db.select().from(pendingObjects)).toEqual([]);
  });
});
