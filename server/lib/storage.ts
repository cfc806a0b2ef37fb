import type { Readable } from "node:stream";

import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";

import type { Env } from "../env";
import { AppError } from "./app-error";

export interface StoredObject {
  body: Readable;
  contentType: string;
  contentLength: number | undefined;
}

export interface Storage {
  put: (key: string, body: Buffer, contentType: string) => Promise<void>;
  get: (key: string) => Promise<StoredObject>;
  remove: (key: string) => Promise<void>;
  ensureBucket: () => Promise<void>;
  close: () => void;
}

export const storageUnavailable = () =>
  new AppError(
    "unavailable",
    503,
    "Image storage is not answering. Nothing was saved; try again in a moment.",
  );

/** Object storage through the S3 API only, so AWS S3 or any compatible store works unchanged. */
export function createStorage(env: Env): Storage {
  const client = new S3Client({
    region: env.S3_REGION,
    endpoint: env.S3_ENDPOINT,
    forcePathStyle: env.S3_FORCE_PATH_STYLE === "true",
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    // Compatible stores do not all understand the SDK's default checksum framing.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
    maxAttempts: 2,
  });
  const bucket = env.S3_BUCKET;

  // Any failure to talk to the store becomes one clear 503; callers clean up what they started.
  const guarded = async <T>(work: () => Promise<T>): Promise<T> => {
    try {
      return await work();
    } catch (error) {
      if (error instanceof AppError) throw error;
      throw Object.assign(storageUnavailable(), { cause: error });
    }
  };

  return {
    put: (key, body, contentType) =>
      guarded(async () => {
        await client.send(
          new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType }),
        );
      }),
    get: (key) =>
      guarded(async () => {
        const result = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
        return {
          body: result.Body as Readable,
          contentType: result.ContentType ?? "application/octet-stream",
          contentLength: result.ContentLength,
        };
      }),
    remove: (key) =>
      guarded(async () => {
        await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
      }),
    ensureBucket: () =>
      guarded(async () => {
        try {
          await client.send(new HeadBucketCommand({ Bucket: bucket }));
        } catch {
          await client.send(new CreateBucketCommand({ Bucket: bucket }));
        }
      }),
    close: () => client.destroy(),
  };
}
