// `npm run bench`: the save path against a floor, on this machine, in one run. A throwaway
// PostgreSQL cluster, the app built and served as in production, and beside it a bare Next.js app
// whose one route handler does one raw insert (bench/floor), both against the same cluster. At 1, 8
// and 32 concurrent clients, each app client walks its own diagnoses (POST /api/diagnoses/{id}/answers,
// each answer to the step the last save named) and each floor client posts to the floor, in a closed
// loop for a fixed time after a warm-up. Only those POSTs are timed. Prints p50/p95/p99 and requests/s
// for both, the ratios, and the issue's targets. Exit code 0 whenever the bench ran, met or not.
// Flags: --quick (3 s a level), --no-build (reuse the last builds, if any), --cpu-prof (the app
// server writes V8 CPU profiles into bench/out/prof and the bench prints where its time went). BENCH_SECONDS sets the seconds a level; DATABASE_POOL_MAX goes to both servers.
// First it times the isolation check (bench/isolation.ts, in a process of its own: one core);
// --isolation-only times only that.
import { spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { closeSync, existsSync, mkdirSync, mkdtempSync, openSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import {
  ensureDatabase,
  ensureDependencies,
  ensurePostgres,
  freePort,
  knex,
  log,
  root,
  run,
  serverEnv,
  spawnChild,
  startCluster,
  waitForHttp,
} from '../scripts/lib.mjs';
import { summarize } from './profile.mjs';

const quick = process.argv.includes('--quick');
const reuseBuilds = process.argv.includes('--no-build');
const cpuProf = process.argv.includes('--cpu-prof');
const isolationOnly = process.argv.includes('--isolation-only');
const SECONDS = Number(process.env.BENCH_SECONDS ?? (quick ? 3 : 8));
const WARMUP_SECONDS = quick ? 1 : 2;
const LEVELS = [1, 8, 32];
// A request that takes longer counts as an error (the stalled app of the issue waited ~60 s).
const REQUEST_TIMEOUT_MS = 15_000;
// Hard caps so that no loop runs unbounded even when every request fails at once.
const MAX_REQUESTS_PER_LEVEL = 250_000;
const MAX_DIAGNOSES_PER_LEVEL = 4_000;
const SETUP_DEADLINE_MS = 120_000;
const POOL_MAX = process.env.DATABASE_POOL_MAX ?? '10';
const TARGETS = { p95: 2, rps: 0.5 };

if (!Number.isFinite(SECONDS) || SECONDS <= 0) {
  console.error(`BENCH_SECONDS must be a positive number of seconds, not ${JSON.stringify(process.env.BENCH_SECONDS)}.`);
  process.exit(2);
}

// The same client code for both targets: node:http with one keep-alive agent, no retries. Nagle is
// off and each request goes out in one write (headers and body together): a body written after the
// headers would otherwise wait on the server's delayed ACK, some 40 ms on loopback, and measure that.
const agent = new http.Agent({ keepAlive: true, maxSockets: Infinity, noDelay: true });

/** One request; resolves (never rejects) with the status (0 for a network error or a timeout). */
function request(base, method, urlPath, body, cookie) {
  return new Promise((resolve) => {
    const payload = body === undefined ? undefined : JSON.stringify(body);
    let settled = false;
    const done = (result) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      resolve(result);
    };
    const req = http.request(
      base + urlPath,
      {
        method,
        agent,
        headers: {
          accept: 'application/json',
          ...(payload ? { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload), origin: base } : {}),
          ...(cookie ? { cookie } : {}),
        },
      },
      (res) => {
        const chunks = [];
        res.on('data', (c) => chunks.push(c));
        res.on('error', (error) => done({ status: 0, json: null, text: error.message, setCookie: [] }));
        res.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          let json = null;
          try {
            json = JSON.parse(text);
          } catch {
            // Not JSON (an HTML error page, say): the status still tells.
          }
          done({ status: res.statusCode, json, text, setCookie: res.headers['set-cookie'] ?? [] });
        });
      },
    );
    // A deadline for the whole exchange, not only for an idle socket.
    const timer = setTimeout(() => {
      req.destroy(new Error(`no answer within ${REQUEST_TIMEOUT_MS / 1000} s`));
    }, REQUEST_TIMEOUT_MS);
    req.on('error', (error) => done({ status: 0, json: null, text: error.message, setCookie: [] }));
    req.on('socket', (socket) => socket.setNoDelay(true));
    req.end(payload);
  });
}

const ok2xx = (status) => status >= 200 && status < 300;
const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

/** A small seeded generator (mulberry32), so that each client picks its own, repeatable paths. */
function randomFrom(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A value well inside a band: the middle of [from, to), or a step beyond the one end it has. */
function valueInBand({ from, to }) {
  if (from !== undefined && to !== undefined) return (from + to) / 2;
  if (from !== undefined) return from + Math.max(0.5, Math.abs(from) * 0.2);
  if (to !== undefined) return to > 0 ? to / 2 : to - Math.max(0.5, Math.abs(to) * 0.2);
  return 0;
}

/**
 * The answer to `step`, in the shape the answers route takes: a band, a choice or a confirmation
 * picked by `random`. Four times in five the pick is among the options that lead on to another step
 * rather than straight to a finding (when there are such), so that walks go deep as well as short.
 */
function answerFor(step, random, findingIds, readings = {}) {
  const clientId = randomUUID();
  const pick = (options) => {
    const onward = options.filter((o) => !findingIds.has(o.outcome));
    const from = onward.length && random() < 0.8 ? onward : options;
    return from[Math.floor(random() * from.length)];
  };
  if (step.kind === 'measure') {
    // A band that asks for the reading again (leads reversed) is not an answer.
    // Bands relative to an earlier reading of the walk are offsets from it (or from the fallback).
    const base = step.reference ? (readings[step.reference.step] ?? step.reference.fallback) : 0;
    const value = base + valueInBand(pick(step.bands.filter((b) => b.outcome !== undefined)));
    return { clientId, stepId: step.id, text: String(Number(value.toFixed(4))), unit: step.unit };
  }
  if (step.kind === 'inspect') return { clientId, stepId: step.id, choice: pick(step.choices).value };
  if (step.kind === 'action') return { clientId, stepId: step.id, confirmed: true };
  throw new Error(`the app asked for an answer to a ${step.kind} step (${step.id})`);
}

/** An answer other than the one expected: the app's doing, so worth another try (a bug of the bench is not). */
class Refused extends Error {}

/** Retries `attempt` while the app refuses or does not answer, until it succeeds or the deadline passes. */
async function untilDeadline(attempt, deadline, onFailure) {
  for (;;) {
    try {
      return await attempt();
    } catch (error) {
      if (!(error instanceof Refused)) throw error;
      onFailure?.(error);
      if (performance.now() + 250 >= deadline) throw error;
      await sleep(250);
    }
  }
}

function must(res, status, what) {
  if (res.status !== status) throw new Refused(`${what} answered ${res.status || 'no answer'}: ${res.text.slice(0, 300)}`);
  if (res.json === null) throw new Refused(`${what} answered ${status} without JSON: ${res.text.slice(0, 300)}`);
  return res.json;
}

/** A technician's client: its own session, site and unit, and diagnoses of calls on that unit. */
async function createAppClient(base, tree, n) {
  const deadline = performance.now() + SETUP_DEADLINE_MS;
  const cookie = await untilDeadline(async () => {
    const res = await request(base, 'POST', '/api/auth/sign-in', { email: 'technician@demo.test', password: 'demo-password' });
    must(res, 200, 'Signing in');
    return res.setCookie.map((c) => c.split(';')[0]).join('; ');
  }, deadline);
  const site = await untilDeadline(
    async () =>
      must(await request(base, 'POST', '/api/sites', { name: `Bench site ${n}`, address: `${n} Bench Row` }, cookie), 201, 'Adding a site'),
    deadline,
  );
  const unit = await untilDeadline(
    async () =>
      must(
        await request(
          base,
          'POST',
          '/api/units',
          {
            siteId: site.id,
            label: `Bench furnace ${n}`,
            ignition: 'two-rod',
            fuel: 'natural-gas',
            controlSupply: '24v',
            transformerVa: 40,
          },
          cookie,
        ),
        201,
        'Adding a unit',
      ),
    deadline,
  );
  const random = randomFrom(0x5eed + n * 7919);
  const client = {
    n,
    random,
    current: null,
    /** Diagnoses started before the timed part, taken one by one as walks reach their findings. */
    ready: [],
    /** Opens a call on the unit and starts a diagnosis; throws when the app refuses or does not answer. */
    async startDiagnosis() {
      const call = must(
        await request(base, 'POST', '/api/calls', { unitId: unit.id, complaint: 'No heat (bench)' }, cookie),
        201,
        'Opening a call',
      );
      const d = must(
        await request(base, 'POST', `/api/calls/${call.id}/diagnoses`, { treeVersionId: tree.id }, cookie),
        201,
        'Starting a diagnosis',
      );
      return { id: d.id, step: d.step };
    },
    /** One save, timed; the step it names is the next one answered. */
    async save() {
      const readings = client.current.readings ?? {};
      const body = answerFor(client.current.step, random, tree.findingIds, readings);
      const started = performance.now();
      const res = await request(base, 'POST', `/api/diagnoses/${client.current.id}/answers`, body, cookie);
      const ms = performance.now() - started;
      const ok = ok2xx(res.status);
      let finished = false;
      if (ok && typeof res.json?.answer?.value === 'number') readings[body.stepId] = res.json.answer.value;
      if (ok && res.json?.next && !res.json.finding) client.current = { id: client.current.id, step: res.json.next, readings };
      else {
        // A finding ends the walk (the repair and its checks are not timed); after a failed save the
        // diagnosis is in a state this client does not know, so it is left too.
        finished = ok;
        client.current = null;
      }
      return { ms, ok, status: res.status, text: res.text, finished };
    },
  };
  return client;
}

function createFloorClient(base) {
  return {
    async save() {
      const started = performance.now();
      const res = await request(base, 'POST', '/api/floor', { clientId: randomUUID(), stepId: 'floor', text: '121', unit: 'V' });
      return { ms: performance.now() - started, ok: ok2xx(res.status), status: res.status, text: res.text, finished: false };
    },
  };
}

function percentile(sorted, p) {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

/**
 * Gives an app client a diagnosis to answer: one started before the timed part if any is left,
 * else a new one (counted, so the report says when the ready ones ran out). Null once `deadline` passes.
 */
async function ensureDiagnosis(client, deadline, stats) {
  if (client.current) return true;
  const ready = client.ready.pop();
  if (ready) {
    client.current = ready;
    return true;
  }
  if (stats.diagnoses >= MAX_DIAGNOSES_PER_LEVEL) return false;
  try {
    stats.diagnoses++;
    stats.startedInLoop++;
    client.current = await untilDeadline(
      () => client.startDiagnosis(),
      deadline,
      (error) => {
        stats.setupErrors++;
        stats.setupSample ??= error.message;
      },
    );
    return true;
  } catch (error) {
    if (error instanceof Refused) return false;
    throw error;
  }
}

/**
 * One target at one level: a warm-up (untimed, also measuring how long a walk is and how fast saves
 * go), then for the app enough diagnoses started for the timed part, then the timed closed loop.
 */
async function runLevel(target, clients) {
  const isApp = target === 'app save';
  const stats = { diagnoses: 0, startedInLoop: 0, setupErrors: 0, setupSample: undefined };
  // The warm-up starts its diagnoses as it goes; those are not the timed part's.
  const warmStats = { ...stats };

  const warmStarted = performance.now();
  const warmUntil = warmStarted + WARMUP_SECONDS * 1000;
  let warmSaves = 0;
  let warmFindings = 0;
  await Promise.all(
    clients.map(async (c) => {
      while (performance.now() < warmUntil && warmSaves < MAX_REQUESTS_PER_LEVEL) {
        if (isApp && !(await ensureDiagnosis(c, warmUntil, warmStats))) break;
        const r = await c.save();
        warmSaves++;
        if (r.finished) warmFindings++;
      }
    }),
  );

  if (isApp) {
    // Start, untimed, the diagnoses the timed part will need (with a margin), so that it times saves only.
    const warmSeconds = (performance.now() - warmStarted) / 1000;
    const savesPerWalk = warmFindings ? warmSaves / warmFindings : 10;
    // Twice the estimate: the warm-up runs colder, and so slower, than the timed part.
    const perClient = Math.ceil(((warmSaves / warmSeconds / clients.length) * SECONDS * 2) / savesPerWalk) + 2;
    const cap = Math.floor(MAX_DIAGNOSES_PER_LEVEL / clients.length);
    const deadline = performance.now() + SETUP_DEADLINE_MS;
    await Promise.all(
      clients.map(async (c) => {
        while (c.ready.length < Math.min(perClient, cap) && performance.now() < deadline) {
          try {
            c.ready.push(await c.startDiagnosis());
            stats.diagnoses++;
          } catch (error) {
            if (!(error instanceof Refused)) throw error;
            stats.setupErrors++;
            stats.setupSample ??= error.message;
            await sleep(250);
          }
        }
      }),
    );
    stats.prepared = clients.reduce((a, c) => a + c.ready.length, 0);
  }

  const latencies = [];
  const failures = {};
  let errors = 0;
  let findings = 0;
  const started = performance.now();
  const until = started + SECONDS * 1000;
  await Promise.all(
    clients.map(async (c) => {
      while (performance.now() < until && latencies.length < MAX_REQUESTS_PER_LEVEL) {
        if (isApp && !(await ensureDiagnosis(c, until, stats))) break;
        const r = await c.save();
        latencies.push(r.ms);
        if (r.finished) findings++;
        if (!r.ok) {
          errors++;
          failures[r.status] ??= { count: 0, sample: r.text.replace(/\s+/g, ' ').slice(0, 160) };
          failures[r.status].count++;
        }
      }
    }),
  );
  const elapsed = (performance.now() - started) / 1000;
  latencies.sort((a, b) => a - b);
  return {
    target,
    clients: clients.length,
    requests: latencies.length,
    errors,
    failures,
    findings,
    seconds: elapsed,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    rps: latencies.length / elapsed,
    capped: latencies.length >= MAX_REQUESTS_PER_LEVEL,
    ...(isApp ? { setup: stats } : {}),
  };
}

const fmt = (v, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : '—');
const mark = (met) => (met ? 'met' : 'MISSED');

function report(rows) {
  const widths = [10, 8, 9, 7, 9, 9, 9, 9];
  const line = (cols) => cols.map((c, i) => (i === 0 ? String(c).padEnd(widths[i]) : String(c).padStart(widths[i]))).join(' ');
  const out = [];
  out.push('');
  out.push(
    `Save path against the floor: ${SECONDS} s a level after ${WARMUP_SECONDS} s of warm-up, times in ms, ` +
      `DATABASE_POOL_MAX=${POOL_MAX} for both, ${os.cpus().length} cores shared by client, servers and PostgreSQL`,
  );
  out.push('');
  out.push(line(['target', 'clients', 'requests', 'errors', 'p50', 'p95', 'p99', 'req/s']));
  for (const { save, floor } of rows) {
    for (const r of [save, floor]) {
      out.push(line([r.target, r.clients, r.requests, r.errors, fmt(r.p50, 2), fmt(r.p95, 2), fmt(r.p99, 2), fmt(r.rps, 0)]));
    }
  }
  out.push('');
  out.push(`Ratios (app save / floor) and the issue's targets: p95 ≤ ${TARGETS.p95}×, throughput ≥ ${TARGETS.rps}×, 0 errors`);
  out.push('');
  const rline = (cols) => cols.map((c, i) => String(c).padStart([8, 11, 8, 13, 8, 8][i])).join(' ');
  out.push(rline(['clients', 'p95 ratio', '', 'req/s ratio', '', 'errors']));
  const verdicts = rows.map(({ save, floor }) => {
    const p95 = save.p95 / floor.p95;
    const rps = save.rps / floor.rps;
    const v = {
      clients: save.clients,
      p95,
      rps,
      p95Met: p95 <= TARGETS.p95,
      rpsMet: rps >= TARGETS.rps,
      errorsMet: save.errors === 0 && floor.errors === 0 && save.requests > 0,
    };
    out.push(rline([v.clients, `${fmt(p95, 2)}×`, mark(v.p95Met), `${fmt(rps, 2)}×`, mark(v.rpsMet), mark(v.errorsMet)]));
    return v;
  });
  const top = verdicts.find((v) => v.clients === 32);
  const topRow = rows.find((r) => r.save.clients === 32);
  if (top) {
    out.push('');
    out.push('Targets at 32 clients (issue 6)');
    out.push(`  ${mark(top.p95Met).padEnd(6)}  save p95 ≤ ${TARGETS.p95}× the floor's p95          (${fmt(top.p95, 2)}×)`);
    out.push(`  ${mark(top.rpsMet).padEnd(6)}  save throughput ≥ ${TARGETS.rps}× the floor's    (${fmt(top.rps, 2)}×)`);
    out.push(
      `  ${mark(top.errorsMet).padEnd(6)}  0 errors                                (${topRow.save.errors} app, ${topRow.floor.errors} floor)`,
    );
  }

  const notes = [];
  for (const { save, floor } of rows) {
    for (const r of [save, floor]) {
      for (const [status, { count, sample }] of Object.entries(r.failures)) {
        notes.push(
          `${r.target} at ${r.clients}: ${count} × ${status === '0' ? 'no answer (network error or timeout)' : `HTTP ${status}`}: ${sample}`,
        );
      }
      if (r.capped) notes.push(`${r.target} at ${r.clients}: stopped at the cap of ${MAX_REQUESTS_PER_LEVEL} requests`);
    }
    if (!save.requests) notes.push(`app save at ${save.clients}: no save was measured (no diagnosis could be started)`);
    const s = save.setup;
    if (save.findings)
      notes.push(
        `app save at ${save.clients}: ${save.findings} walks reached their finding, ${fmt(save.requests / save.findings, 1)} saves a walk`,
      );
    if (s.setupErrors)
      notes.push(
        `app save at ${save.clients}: ${s.setupErrors} failed attempts to open a call or start a diagnosis (untimed): ${s.setupSample}`,
      );
    if (s.startedInLoop)
      notes.push(
        `app save at ${save.clients}: the ${s.prepared} diagnoses started beforehand ran out; ${s.startedInLoop} more ${s.startedInLoop === 1 ? 'was' : 'were'} started during the timed part`,
      );
  }
  if (notes.length) {
    out.push('');
    out.push('Notes');
    for (const note of notes) out.push(`  ${note}`);
  }
  out.push('');
  console.log(out.join('\n'));
  return verdicts;
}

/** The isolation check's time, from bench/isolation.ts run through tsx in a process of its own; null when it could not run. */
function isolationBench() {
  log('Timing the isolation check (bench/isolation.ts)…');
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join('bench', 'isolation.ts'), '--json'], {
    cwd: root,
    encoding: 'utf8',
    env: { ...process.env, NODE_ENV: 'production' },
  });
  if (r.status !== 0) {
    console.error(`The isolation bench did not run (${r.status ?? r.signal}):\n${r.stderr}`);
    return null;
  }
  const figures = JSON.parse(r.stdout.trim().split('\n').at(-1));
  const d = figures.defaultTree;
  const g = figures.generatedTree;
  console.log(
    [
      '',
      `Isolation check (median of ${figures.runs} runs after a warm-up, one process)`,
      `  default tree    ${String(d.faults).padStart(3)} faults × ${d.steps} steps: ${d.ok}/${d.faults} isolated, ${d.stepsWalked} steps walked, ${d.medianMs.toFixed(1)} ms`,
      `  generated tree  ${String(g.faults).padStart(3)} faults × ${g.steps} steps: ${g.ok}/${g.faults} isolated, ${g.stepsWalked} steps walked, ${g.medianMs.toFixed(1)} ms — target ≤ ${g.targetMs} ms ${g.met ? 'met' : 'MISSED'}`,
      '',
    ].join('\n'),
  );
  return figures;
}

async function main() {
  const isolation = isolationBench();
  if (isolationOnly) {
    if (isolation) {
      mkdirSync(path.join(root, 'bench', 'out'), { recursive: true });
      writeFileSync(
        path.join(root, 'bench', 'out', 'isolation.json'),
        JSON.stringify({ at: new Date().toISOString(), ...isolation }, null, 2),
      );
    }
    return;
  }
  ensureDependencies();
  const bin = ensurePostgres();
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'proving-ground-bench-'));
  const outDir = path.join(root, 'bench', 'out');
  mkdirSync(outDir, { recursive: true });
  const profDir = path.join(outDir, 'prof');
  if (cpuProf) {
    rmSync(profDir, { recursive: true, force: true });
    mkdirSync(profDir, { recursive: true });
  }
  const pgPort = await freePort();
  const children = [];
  const logs = [];
  let cluster;
  let cleaned = false;
  let stoppingForProfile = false;
  const cleanup = () => {
    if (cleaned) return;
    cleaned = true;
    for (const child of children) if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
    for (const fd of logs) closeSync(fd);
    cluster?.stop();
    rmSync(tmp, { recursive: true, force: true });
  };
  for (const signal of ['SIGINT', 'SIGTERM']) {
    process.on(signal, () => {
      console.error(`\n${signal}: stopping the servers and removing the bench cluster…`);
      cleanup();
      process.exit(130);
    });
  }
  try {
    cluster = await startCluster({ bin, dir: tmp, port: pgPort, throwaway: true });
    const databaseUrl = ensureDatabase(bin, pgPort, 'proving_ground_bench');
    const env = {
      ...process.env,
      DATABASE_URL: databaseUrl,
      DATABASE_POOL_MAX: POOL_MAX,
      SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-bench',
      SEED_DEMO: 'true',
      NEXT_TELEMETRY_DISABLED: '1',
    };
    log('Migrating and seeding the bench database…');
    knex(['migrate:latest'], env);
    knex(['seed:run'], env);

    const nextBin = path.join(root, 'node_modules', '.bin', 'next');
    const builds = [path.join(root, '.next-bench', 'BUILD_ID'), path.join(root, 'bench', 'floor', '.next-floor', 'BUILD_ID')];
    if (reuseBuilds && builds.every((f) => existsSync(f))) {
      log('Reusing the last builds (.next-bench, bench/floor/.next-floor): they may be older than the code.');
    } else {
      log('Building the app into .next-bench…');
      run(nextBin, ['build'], { env: { ...env, NEXT_DIST_DIR: '.next-bench' } });
      log('Building the floor (bench/floor, into bench/floor/.next-floor)…');
      run(nextBin, ['build', 'bench/floor'], { env });
    }

    const [appPort, floorPort] = [await freePort(), await freePort()];
    const app = `http://127.0.0.1:${appPort}`;
    const floor = `http://127.0.0.1:${floorPort}`;
    // The servers' own output goes to files, so that a flood of errors under load does not bury the table.
    const appLog = openSync(path.join(outDir, 'app.log'), 'w');
    const floorLog = openSync(path.join(outDir, 'floor.log'), 'w');
    logs.push(appLog, floorLog);
    const production = { ...env, NODE_ENV: 'production' };
    children.push(
      // --cpu-prof is refused in NODE_OPTIONS, so a profiled server is started through node itself.
      spawnChild(
        cpuProf ? process.execPath : nextBin,
        [
          ...(cpuProf ? ['--cpu-prof', `--cpu-prof-dir=${profDir}`, path.join(root, 'node_modules', 'next', 'dist', 'bin', 'next')] : []),
          'start',
          '-H',
          '127.0.0.1',
          '-p',
          String(appPort),
        ],
        {
          env: serverEnv({ ...production, NEXT_DIST_DIR: '.next-bench', APP_URL: app }),
          stdio: ['ignore', appLog, appLog],
        },
      ),
      spawnChild(nextBin, ['start', 'bench/floor', '-H', '127.0.0.1', '-p', String(floorPort)], {
        env: production,
        stdio: ['ignore', floorLog, floorLog],
      }),
    );
    for (const child of children) {
      child.on('exit', (code, signal) => {
        if (!cleaned && !stoppingForProfile)
          console.error(`A server stopped during the bench (${code ?? signal}); see bench/out/app.log and bench/out/floor.log.`);
      });
    }
    await waitForHttp(`${app}/api/health`);
    await waitForHttp(`${floor}/api/floor`);
    log(`App at ${app}, floor at ${floor}; server output in bench/out/.`);

    const first = await request(app, 'POST', '/api/auth/sign-in', { email: 'technician@demo.test', password: 'demo-password' });
    must(first, 200, 'Signing in as the demo technician');
    const cookie = first.setCookie.map((c) => c.split(';')[0]).join('; ');
    const trees = must(await request(app, 'GET', '/api/trees', undefined, cookie), 200, 'Listing the trees');
    const treeVersionId = trees.find((t) => t.published)?.published.id;
    if (!treeVersionId) throw new Error('The demo has no published tree version to diagnose with.');
    // Which steps are findings, read from the published graph (never a list of step ids kept here).
    const graph = must(
      await request(app, 'GET', `/api/tree-versions/${treeVersionId}`, undefined, cookie),
      200,
      'Reading the tree version',
    ).graph;
    const tree = { id: treeVersionId, findingIds: new Set(graph.steps.filter((s) => s.kind === 'finding').map((s) => s.id)) };

    log(`Setting up ${Math.max(...LEVELS)} technician clients (session, site, unit)…`);
    const appClients = [];
    for (let i = 0; i < Math.max(...LEVELS); i += 8) {
      appClients.push(
        ...(await Promise.all(
          Array.from({ length: Math.min(8, Math.max(...LEVELS) - i) }, (_, k) => createAppClient(app, tree, i + k + 1)),
        )),
      );
    }

    const rows = [];
    for (const n of LEVELS) {
      log(`${n} client${n === 1 ? '' : 's'}: app saves…`);
      const save = await runLevel('app save', appClients.slice(0, n));
      log(`${n} client${n === 1 ? '' : 's'}: floor…`);
      const bare = await runLevel(
        'floor',
        Array.from({ length: n }, () => createFloorClient(floor)),
      );
      rows.push({ save, floor: bare });
    }
    const verdicts = report(rows);
    const file = path.join(outDir, 'last.json');
    writeFileSync(
      file,
      JSON.stringify(
        { at: new Date().toISOString(), seconds: SECONDS, warmup: WARMUP_SECONDS, poolMax: POOL_MAX, rows, verdicts, isolation },
        null,
        2,
      ),
    );
    log(`Figures written to ${path.relative(root, file)}.`);
    if (cpuProf) {
      // The profile is written when the server exits: stop it and wait, before the cluster goes.
      const server = children[0];
      log('Stopping the app server so that it writes its CPU profile…');
      stoppingForProfile = true;
      await new Promise((resolve) => {
        const timer = setTimeout(resolve, 15_000);
        server.once('exit', () => (clearTimeout(timer), resolve()));
        server.kill('SIGINT');
      });
      summarize(profDir);
    }
  } finally {
    cleanup();
  }
}

main().then(
  () => process.exit(0),
  (error) => {
    console.error(`The bench could not run: ${error.stack ?? error}`);
    process.exit(1);
  },
);
