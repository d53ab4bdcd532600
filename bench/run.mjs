// `npm run bench`: the save path against a floor, on this machine, in one run. A throwaway
// PostgreSQL cluster, the app built and served as in production, and beside it a bare Next.js app
// whose one route handler does one raw insert (bench/floor). At 1, 8 and 32 concurrent clients,
// each client walks its own diagnoses (POST /api/diagnoses/{id}/answers, each answer to the step
// the last save named) or posts to the floor, in a closed loop for a fixed time. Prints p50, p95,
// p99 and requests/s for both, the ratios, and the targets at 32 clients.
// Flags: --quick (3 s a level). BENCH_SECONDS sets the seconds a level.
import { randomUUID } from 'node:crypto';
import http from 'node:http';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import {
  ensureDatabase,
  ensureDependencies,
  ensurePostgres,
  freePort,
  knex,
  log,
  psql,
  root,
  run,
  serverEnv,
  spawnChild,
  startCluster,
  waitForHttp,
} from '../scripts/lib.mjs';

const quick = process.argv.includes('--quick');
const SECONDS = Number(process.env.BENCH_SECONDS ?? (quick ? 3 : 8));
const WARMUP_SECONDS = quick ? 1 : 2;
const LEVELS = [1, 8, 32];
const REQUEST_TIMEOUT_MS = 15_000;
const MAX_REQUESTS_PER_LEVEL = 200_000;

const agent = new http.Agent({ keepAlive: true, maxSockets: 256 });

/** One HTTP request with a keep-alive agent; the same client code for the app and the floor. */
function request(base, method, urlPath, body, cookie) {
  return new Promise((resolve) => {
    const payload = body === undefined ? undefined : JSON.stringify(body);
    const req = http.request(
      base + urlPath,
      {
        method,
        agent,
        timeout: REQUEST_TIMEOUT_MS,
        headers: {
          ...(payload ? { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload) } : {}),
          ...(cookie ? { cookie } : {}),
        },
      },
      (res) => {
        const chunks = [];
        res.on('data', (c) => chunks.push(c));
        res.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          let json = null;
          try {
            json = JSON.parse(text);
          } catch {
            /* not JSON */
          }
          resolve({ status: res.statusCode, json, text, setCookie: res.headers['set-cookie'] ?? [] });
        });
      },
    );
    req.on('timeout', () => req.destroy(new Error('timeout')));
    req.on('error', (error) => resolve({ status: 0, json: null, text: String(error.message), setCookie: [] }));
    if (payload) req.write(payload);
    req.end();
  });
}

/** An answer to `step`: a value inside a band picked by `k`, the k-th choice, or a confirmation. */
function answerFor(step, k) {
  if (step.kind === 'measure') {
    const band = step.bands[k % step.bands.length];
    const { from, to } = band;
    const value =
      from !== undefined && to !== undefined
        ? (from + to) / 2
        : from !== undefined
          ? from + Math.max(1, Math.abs(from) * 0.5)
          : to > 0
            ? to / 2
            : to - 1;
    return { clientId: randomUUID(), stepId: step.id, text: String(Number(value.toFixed(4))), unit: step.unit };
  }
  if (step.kind === 'inspect') return { clientId: randomUUID(), stepId: step.id, choice: step.choices[k % step.choices.length].value };
  return { clientId: randomUUID(), stepId: step.id, confirmed: true };
}

function percentile(sorted, p) {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** A client of the app: its own session, site, unit, and a fresh diagnosis whenever one reaches its finding. */
async function appClient(base, treeVersionId, n) {
  const signIn = await request(base, 'POST', '/api/auth/sign-in', { email: 'technician@demo.test', password: 'demo-password' });
  if (signIn.status !== 200) throw new Error(`sign-in answered ${signIn.status}: ${signIn.text}`);
  const cookie = signIn.setCookie.map((c) => c.split(';')[0]).join('; ');
  const site = await request(base, 'POST', '/api/sites', { name: `Bench site ${n}`, address: `${n} Bench Row` }, cookie);
  const unit = await request(
    base,
    'POST',
    '/api/units',
    {
      siteId: site.json.id,
      label: `Bench furnace ${n}`,
      ignition: 'two-rod',
      fuel: 'natural-gas',
      controlSupply: '24v',
      transformerVa: 40,
    },
    cookie,
  );
  let k = n;
  const fresh = async () => {
    const call = await request(base, 'POST', '/api/calls', { unitId: unit.json.id, complaint: 'No heat (bench)' }, cookie);
    const d = await request(base, 'POST', `/api/calls/${call.json.id}/diagnoses`, { treeVersionId }, cookie);
    if (d.status !== 201) throw new Error(`starting a diagnosis answered ${d.status}: ${d.text}`);
    return { id: d.json.id, step: d.json.step };
  };
  let current = await fresh();
  return {
    /** One timed save; the set-up of the next diagnosis after a finding is not timed. */
    async step() {
      const body = answerFor(current.step, k++);
      const started = performance.now();
      const res = await request(base, 'POST', `/api/diagnoses/${current.id}/answers`, body, cookie);
      const ms = performance.now() - started;
      const ok = res.status === 200;
      if (ok && res.json.next) current = { id: current.id, step: res.json.next };
      else current = await fresh();
      return { ms, ok, status: res.status };
    },
  };
}

function floorClient(base) {
  return {
    async step() {
      const started = performance.now();
      const res = await request(base, 'POST', '/api/floor', { clientId: randomUUID(), value: 121 });
      return { ms: performance.now() - started, ok: res.status === 200, status: res.status };
    },
  };
}

/** Runs every client in a closed loop for `seconds` after a warm-up; bounded in time and in count. */
async function level(clients, seconds) {
  const warmUntil = performance.now() + WARMUP_SECONDS * 1000;
  await Promise.all(
    clients.map(async (c) => {
      while (performance.now() < warmUntil) await c.step();
    }),
  );
  const latencies = [];
  const statuses = {};
  let errors = 0;
  const started = performance.now();
  const until = started + seconds * 1000;
  await Promise.all(
    clients.map(async (c) => {
      while (performance.now() < until && latencies.length < MAX_REQUESTS_PER_LEVEL) {
        const r = await c.step();
        latencies.push(r.ms);
        if (!r.ok) {
          errors++;
          statuses[r.status] = (statuses[r.status] ?? 0) + 1;
        }
      }
    }),
  );
  const elapsed = (performance.now() - started) / 1000;
  latencies.sort((a, b) => a - b);
  return {
    requests: latencies.length,
    errors,
    statuses,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    rps: latencies.length / elapsed,
  };
}

const fmt = (v, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : '—');

async function main() {
  ensureDependencies();
  const bin = ensurePostgres();
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'proving-ground-bench-'));
  const pgPort = await freePort();
  const cluster = await startCluster({ bin, dir: tmp, port: pgPort, throwaway: true });
  const children = [];
  const cleanup = () => {
    for (const child of children) if (child.exitCode === null) child.kill('SIGTERM');
    cluster.stop();
    rmSync(tmp, { recursive: true, force: true });
  };
  process.on('SIGINT', () => {
    cleanup();
    process.exit(130);
  });
  try {
    const databaseUrl = ensureDatabase(bin, pgPort, 'proving_ground_bench');
    psql(
      bin,
      pgPort,
      'CREATE TABLE IF NOT EXISTS bench_floor (id bigserial PRIMARY KEY, body jsonb, at timestamptz NOT NULL DEFAULT now())',
      'proving_ground_bench',
    );
    psql(bin, pgPort, 'GRANT ALL ON bench_floor, bench_floor_id_seq TO proving_ground', 'proving_ground_bench');
    const env = {
      ...process.env,
      DATABASE_URL: databaseUrl,
      SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-bench',
      SEED_DEMO: 'true',
      NEXT_TELEMETRY_DISABLED: '1',
      NODE_ENV: 'production',
    };
    log('Migrating and seeding the bench database…');
    knex(['migrate:latest'], env);
    knex(['seed:run'], env);
    log('Building the app (.next-bench) and the floor (bench/floor)…');
    run(path.join(root, 'node_modules', '.bin', 'next'), ['build'], { env: { ...env, NEXT_DIST_DIR: '.next-bench' } });
    run(path.join(root, 'node_modules', '.bin', 'next'), ['build', 'bench/floor'], { env });
    const [appPort, floorPort] = [await freePort(), await freePort()];
    const app = `http://127.0.0.1:${appPort}`;
    const floor = `http://127.0.0.1:${floorPort}`;
    const nextBin = path.join(root, 'node_modules', '.bin', 'next');
    children.push(
      spawnChild(nextBin, ['start', '-H', '127.0.0.1', '-p', String(appPort)], {
        env: serverEnv({ ...env, NEXT_DIST_DIR: '.next-bench', APP_URL: app }),
        stdio: ['ignore', 'ignore', 'inherit'],
      }),
      spawnChild(nextBin, ['start', 'bench/floor', '-H', '127.0.0.1', '-p', String(floorPort)], {
        env,
        stdio: ['ignore', 'ignore', 'inherit'],
      }),
    );
    await waitForHttp(`${app}/api/health`);
    await waitForHttp(`${floor}/api/floor`);

    const trees = await (async () => {
      const c = await request(app, 'POST', '/api/auth/sign-in', { email: 'technician@demo.test', password: 'demo-password' });
      const cookie = c.setCookie.map((x) => x.split(';')[0]).join('; ');
      return (await request(app, 'GET', '/api/trees', undefined, cookie)).json;
    })();
    const treeVersionId = trees.find((t) => t.published).published.id;

    const rows = [];
    for (const n of LEVELS) {
      log(`${n} client(s): app saves…`);
      const appClients = await Promise.all(Array.from({ length: n }, (_, i) => appClient(app, treeVersionId, i + n * 100)));
      const save = await level(appClients, SECONDS);
      log(`${n} client(s): floor…`);
      const bare = await level(
        Array.from({ length: n }, () => floorClient(floor)),
        SECONDS,
      );
      rows.push({ n, save, bare });
    }

    const line = (cols) => cols.map((c, i) => String(c).padStart(i < 2 ? 10 : 9)).join(' ');
    console.log(`\nSave path against the floor (${SECONDS} s a level after ${WARMUP_SECONDS} s of warm-up; times in ms)\n`);
    console.log(line(['target', 'clients', 'requests', 'errors', 'p50', 'p95', 'p99', 'req/s']));
    for (const { n, save, bare } of rows) {
      console.log(
        line(['app save', n, save.requests, save.errors, fmt(save.p50, 2), fmt(save.p95, 2), fmt(save.p99, 2), fmt(save.rps, 0)]),
      );
      console.log(line(['floor', n, bare.requests, bare.errors, fmt(bare.p50, 2), fmt(bare.p95, 2), fmt(bare.p99, 2), fmt(bare.rps, 0)]));
      if (save.errors) console.log(`           app errors by status: ${JSON.stringify(save.statuses)}`);
    }
    console.log('\nRatios (app save / floor)\n');
    console.log(line(['clients', 'p95', 'req/s']).slice(11));
    for (const { n, save, bare } of rows)
      console.log(line(['', n, `${fmt(save.p95 / bare.p95, 2)}×`, `${fmt(save.rps / bare.rps, 2)}×`]).slice(11));
    const top = rows.find((r) => r.n === 32);
    const targets = [
      ['save p95 ≤ 2× the floor’s p95 at 32 clients', top.save.p95 <= 2 * top.bare.p95, `${fmt(top.save.p95 / top.bare.p95, 2)}×`],
      ['throughput ≥ 0.5× the floor’s at 32 clients', top.save.rps >= 0.5 * top.bare.rps, `${fmt(top.save.rps / top.bare.rps, 2)}×`],
      ['0 errors at every level', rows.every((r) => r.save.errors === 0), `${rows.reduce((a, r) => a + r.save.errors, 0)} errors`],
    ];
    console.log('\nTargets (issue: hold up under load)\n');
    for (const [name, met, value] of targets) console.log(`  ${met ? 'met   ' : 'MISSED'}  ${name}  (${value})`);
    console.log('');
  } finally {
    cleanup();
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
