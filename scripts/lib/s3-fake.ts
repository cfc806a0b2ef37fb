import { mkdirSync } from "node:fs";
import type { AddressInfo } from "node:net";

import S3rver from "s3rver";

export interface S3Fake {
  readonly port: number;
  readonly endpoint: string;
  /** Stops listening (as if the store went down); `start` listens again on the same port. */
  stop: () => Promise<void>;
  start: () => Promise<void>;
}

/** A local S3-compatible store on 127.0.0.1 keeping its objects in `dir`. */
export async function startS3Fake(options: { dir: string; port?: number }): Promise<S3Fake> {
  mkdirSync(options.dir, { recursive: true });
  let port = options.port ?? 0;
  let server: S3rver | null = null;

  const listen = async () => {
    const instance = new S3rver({
      address: "127.0.0.1",
      port,
      directory: options.dir,
      silent: true,
    });
    const address = (await instance.run()) as AddressInfo;
    port = address.port;
    server = instance;
  };
  await listen();

  return {
    get port() {
      return port;
    },
    get endpoint() {
      return `http://127.0.0.1:${port}`;
    },
    async stop() {
      const current = server;
      server = null;
      await current?.close();
    },
    async start() {
      if (!server) await listen();
    },
  };
}
