import http from "node:http";
import zlib from "node:zlib";

/**
 * Timing an API endpoint as a phone's browser calls it, for the benches: one kept-alive
 * connection, compression asked for, the whole reply decoded before it counts as received.
 */

export const percentile = (values: number[], p: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
};

/** What a phone's browser asks for; it is sent what the server prefers among them. */
const browserAcceptEncoding = "gzip, deflate, br, zstd";

const decoders: Record<string, (body: Buffer) => Buffer> = {
  br: (body) => zlib.brotliDecompressSync(body),
  gzip: (body) => zlib.gunzipSync(body),
  deflate: (body) => zlib.inflateSync(body),
};

/**
 * One GET over a kept-alive connection, as a browser makes it: it asks for compression and decodes
 * the whole reply before it counts as received. (Node's `fetch` decodes through web streams chunk
 * by chunk, about 1 ms more for the comparison's 50 KB, a cost of that client that no phone pays.)
 */
export function browserGet(url: string, cookie: string, origin: string) {
  return new Promise<void>((resolve, reject) => {
    const request = http.get(
      url,
      { agent, headers: { cookie, origin, "accept-encoding": browserAcceptEncoding } },
      (response) => {
        const chunks: Buffer[] = [];
        response.on("data", (chunk: Buffer) => chunks.push(chunk));
        response.on("error", reject);
        response.on("end", () => {
          try {
            const encoding = response.headers["content-encoding"];
            const body = Buffer.concat(chunks);
            if (encoding) {
              const decode = decoders[encoding];
              if (!decode) throw new Error(`${url}: unexpected encoding ${encoding}`);
              decode(body);
            }
            if (response.statusCode !== 200) throw new Error(`${url}: HTTP ${response.statusCode}`);
            resolve();
          } catch (error) {
            reject(error instanceof Error ? error : new Error(String(error)));
          }
        });
      },
    );
    request.on("error", reject);
  });
}

/** One kept-alive connection for every timed request, as a browser keeps one to its server. */
export const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });

export async function httpTimes(url: string, cookie: string, origin: string, count: number) {
  const times: number[] = [];
  for (let n = 0; n < count; n += 1) {
    const t0 = performance.now();
    await browserGet(url, cookie, origin);
    times.push(performance.now() - t0);
  }
  return times;
}
