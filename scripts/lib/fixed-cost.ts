/**
 * What every signed-in request pays before its own work: the p50 of a signed-in route that only
 * checks the session (GET /api/auth/me) minus the p50 of the public health route, both over one
 * connection, one request after another, the two routes interleaved so drift hits both alike.
 */
export interface FixedCost {
  count: number;
  healthP50: number;
  signedInP50: number;
  /** signedInP50 − healthP50, in milliseconds. */
  fixedCost: number;
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
};

async function once(url: string, headers: Record<string, string>): Promise<number> {
  const t0 = performance.now();
  const response = await fetch(url, { headers });
  await response.arrayBuffer();
  if (!response.ok) throw new Error(`${url}: HTTP ${response.status}`);
  return performance.now() - t0;
}

export async function measureFixedCost(
  origin: string,
  cookie: string,
  count = 2000,
): Promise<FixedCost> {
  const health = `${origin}/api/health`;
  const me = `${origin}/api/auth/me`;
  // The health route is asked as a visitor would: with a cookie, it would check the session too.
  const visitor = { origin };
  const headers = { cookie, origin };
  for (let n = 0; n < 200; n += 1) {
    await once(health, visitor);
    await once(me, headers);
  }
  const healthTimes: number[] = [];
  const meTimes: number[] = [];
  for (let n = 0; n < count; n += 1) {
    healthTimes.push(await once(health, visitor));
    meTimes.push(await once(me, headers));
  }
  const healthP50 = median(healthTimes);
  const signedInP50 = median(meTimes);
  return { count, healthP50, signedInP50, fixedCost: signedInP50 - healthP50 };
}

export function fixedCostLine(result: FixedCost): string {
  return `signed-in request fixed cost: ${(result.fixedCost * 1000).toFixed(0)} µs (p50 GET /api/auth/me ${result.signedInP50.toFixed(3)} ms − p50 GET /api/health ${result.healthP50.toFixed(3)} ms, ${result.count} each, one connection; target ≤ 500 µs)`;
}
