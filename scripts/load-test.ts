// Load test (not part of npm test): `npm run load-test` against a running `npm start` (the seeded
// demo on http://127.0.0.1:8080, or LOAD_TEST_URL). Signs in as the demo viewer, then holds
// LOAD_TEST_RATE requests/s (default 100) of mixed reads for LOAD_TEST_SECONDS (default 60) and
// prints requests, errors and p50/p95/p99 latency. Goal: no errors and p95 under 100 ms.
// autocannon ships no types; the little of its API used here, typed locally.
type AutocannonResult = { requests: { total: number }; errors: number; timeouts: number; non2xx: number };
type AutocannonInstance = Promise<AutocannonResult> & {
  on(event: 'response', fn: (client: unknown, statusCode: number, bytes: number, responseTime: number) => void): void;
};
type AutocannonOptions = {
  url: string;
  connections: number;
  overallRate: number;
  duration: number;
  headers: Record<string, string>;
  requests: { method: 'GET'; path: string }[];
};
// eslint-disable-next-line @typescript-eslint/no-require-imports
const autocannon = require('autocannon') as (opts: AutocannonOptions) => AutocannonInstance;

const BASE = (process.env.LOAD_TEST_URL ?? 'http://127.0.0.1:8080').replace(/\/+$/, '');
const RATE = Number(process.env.LOAD_TEST_RATE ?? 100);
const SECONDS = Number(process.env.LOAD_TEST_SECONDS ?? 60);
const EMAIL = process.env.LOAD_TEST_EMAIL ?? 'viewer@trimwire.test';
const PASSWORD = process.env.LOAD_TEST_PASSWORD ?? 'trimwire-demo';

async function signIn(): Promise<string> {
  const csrfRes = await fetch(`${BASE}/api/auth/csrf`).catch((err: unknown) => {
    throw new Error(`Nothing answers at ${BASE} (${err instanceof Error ? err.message : String(err)}). Start it with \`npm start\` first.`);
  });
  const cookie = (csrfRes.headers.get('set-cookie') ?? '').split(';')[0]!;
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const res = await fetch(`${BASE}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': csrfToken, cookie },
    body: JSON.stringify({ email: EMAIL, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`Sign-in as ${EMAIL} failed with ${res.status}: ${await res.text()}`);
  return (res.headers.get('set-cookie') ?? cookie).split(';')[0]!;
}

async function getJson<T>(cookie: string, path: string): Promise<T> {
  const res = await fetch(`${BASE}${path}`, { headers: { cookie } });
  if (res.status !== 200) throw new Error(`GET ${path} answered ${res.status}`);
  return (await res.json()) as T;
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

async function main(): Promise<void> {
  const cookie = await signIn();
  const { designs } = await getJson<{ designs: { id: string }[] }>(cookie, '/api/designs');
  if (!designs.length) throw new Error('The team has no designs; run the demo seed (`npm start` in development) first.');
  const paths = ['/api/designs', '/api/review-queue', '/api/auth/me'];
  for (const d of designs) {
    paths.push(`/api/designs/${d.id}`, `/api/designs/${d.id}/proposals`, `/api/designs/${d.id}/proposals?sort=rule&status=open`);
    const detail = await getJson<{ latestScan: { id: string } | null }>(cookie, `/api/designs/${d.id}`);
    if (detail.latestScan) paths.push(`/api/scans/${detail.latestScan.id}`);
    const { proposals } = await getJson<{ proposals: { id: string }[] }>(cookie, `/api/designs/${d.id}/proposals`);
    for (const p of proposals.slice(0, 3)) paths.push(`/api/proposals/${p.id}`);
  }
  console.log(`Load test: ${RATE} requests/s for ${SECONDS} s against ${BASE}, ${paths.length} read routes in rotation, signed in as ${EMAIL}`);
  const times: number[] = [];
  const statuses = new Map<number, number>();
  const instance = autocannon({
    url: BASE,
    connections: 10,
    overallRate: RATE,
    duration: SECONDS,
    headers: { cookie },
    requests: paths.map((path) => ({ method: 'GET' as const, path })),
  });
  instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
    times.push(responseTime);
    statuses.set(statusCode, (statuses.get(statusCode) ?? 0) + 1);
  });
  const result = await instance;
  times.sort((a, b) => a - b);
  const non2xx = result.non2xx;
  const errors = result.errors + result.timeouts + non2xx;
  const p95 = percentile(times, 95);
  const rows: [string, string][] = [
    ['requests', String(result.requests.total)],
    ['achieved rate (req/s)', (result.requests.total / SECONDS).toFixed(1)],
    ['errors (socket + timeouts + non-2xx)', `${errors} (${result.errors} + ${result.timeouts} + ${non2xx})`],
    ['status codes', [...statuses.entries()].map(([s, n]) => `${s}×${n}`).join(', ')],
    ['latency p50 (ms)', percentile(times, 50).toFixed(1)],
    ['latency p95 (ms)', p95.toFixed(1)],
    ['latency p99 (ms)', percentile(times, 99).toFixed(1)],
    ['latency max (ms)', (times[times.length - 1] ?? NaN).toFixed(1)],
  ];
  const w = Math.max(...rows.map((r) => r[0].length));
  console.log(rows.map(([k, v]) => `${k.padEnd(w)}  ${v}`).join('\n'));
  const ok = errors === 0 && p95 < 100;
  console.log(ok ? 'Goal met: no errors and p95 < 100 ms.' : 'Goal NOT met (no errors and p95 < 100 ms).');
  process.exit(ok ? 0 : 1);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
