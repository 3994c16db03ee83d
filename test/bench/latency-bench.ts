// ladder.p95, parts.p95, jobs.p95 and insights.<name>.p95: read endpoints against the bench shop
// (100,000 piston units, 1,000,000 ledger rows), one request after another, signed in as the owner.
import { HttpSession, type ServerProcess } from '../drills/support';
import { figure, percentile, say, skipped } from './emit';
import { BENCH_PASSWORD, type BenchShop } from './generate';

const INSIGHTS = [
  ['sales', '/api/insights/sales'],
  ['sales-monthly', '/api/insights/sales/monthly'],
  ['top-sellers', '/api/insights/top-sellers'],
  ['stock-value', '/api/insights/stock-value'],
  ['dead-stock', '/api/insights/dead-stock'],
  ['abc', '/api/insights/abc'],
  ['exposure', '/api/insights/exposure'],
  ['supplier-reliability', '/api/insights/supplier-reliability'],
] as const;

async function measure(
  session: HttpSession,
  name: string,
  url: string,
  count: number,
): Promise<void> {
  for (let i = 0; i < 3; i++) {
    const warm = await session.get(url);
    if (warm.status !== 200)
      throw new Error(
        `${name}: GET ${url} answered ${warm.status} ${JSON.stringify(warm.body).slice(0, 200)}`,
      );
  }
  const ms: number[] = [];
  let bytes = 0;
  for (let i = 0; i < count; i++) {
    const r = await session.get(url);
    ms.push(r.ms);
    bytes = JSON.stringify(r.body).length;
  }
  figure({
    name: `${name}.p95`,
    value: percentile(ms, 0.95),
    unit: 'ms',
    p50Ms: Math.round(percentile(ms, 0.5) * 10) / 10,
    requests: count,
    answerKb: Math.round(bytes / 100) / 10,
  });
}

export async function latencyBench(opts: {
  server: ServerProcess;
  shop: BenchShop;
}): Promise<void> {
  const session = new HttpSession(opts.server.url);
  await session.signIn({
    id: '',
    email: opts.shop.users.owner.email,
    password: BENCH_PASSWORD,
    role: 'owner',
  });
  // What the server offers, from its own API description: a figure for a missing route is skipped.
  const doc = (await session.get('/api/openapi.json')).body as { paths?: Record<string, unknown> };
  const has = (path: string) =>
    Boolean(doc.paths && Object.keys(doc.paths).some((p) => p === path));

  const lists = [
    [
      'ladder',
      '/api/engine-families/{id}/ladder',
      `/api/engine-families/${opts.shop.typicalFamilyId}/ladder`,
    ],
    ['parts', '/api/parts', '/api/parts?page=1&pageSize=50'],
    ['jobs', '/api/jobs', '/api/jobs?state=open&page=1&pageSize=50'],
  ] as const;
  for (const [name, path, url] of lists) {
    if (!has(path)) {
      skipped(`${name}.p95`, `${path} is not served yet`);
      continue;
    }
    say(`${name}: 100 requests`);
    await measure(session, name, url, 100);
  }
  for (const [name, path] of INSIGHTS) {
    if (!has(path)) {
      skipped(`insights.${name}.p95`, `${path} is not served yet`);
      continue;
    }
    say(`insights.${name}: 30 requests`);
    await measure(session, `insights.${name}`, path, 30);
  }
}
