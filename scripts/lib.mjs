// Shared lifecycle helpers for scripts/start.mjs and scripts/test.mjs: dependencies, PostgreSQL
// from Debian's package on loopback, Chromium for the browser tests. Plain Node, no packages,
// so it runs before `npm ci` has.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, statSync, writeFileSync, readFileSync, chownSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';

export const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..');
const isRoot = process.getuid?.() === 0;

export function log(message) {
  console.log(`\x1b[38;5;173m▸\x1b[0m ${message}`);
}

export function run(cmd, args, opts = {}) {
  const res = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...opts });
  if (res.status !== 0) {
    throw new Error(`${cmd} ${args.join(' ')} exited with ${res.status ?? res.signal}`);
  }
  return res;
}

function quiet(cmd, args, opts = {}) {
  return spawnSync(cmd, args, { encoding: 'utf8', cwd: root, ...opts });
}

/** `npm ci` when node_modules is missing or older than the lockfile. */
export function ensureDependencies() {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const lock = path.join(root, 'package-lock.json');
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  log('Installing dependencies (npm ci)…');
  run('npm', ['ci', '--no-audit', '--no-fund']);
}

function aptInstall(pkgs, why) {
  if (!isRoot || !existsSync('/usr/bin/apt-get')) {
    throw new Error(`${why} is missing. Install it with: sudo apt-get install -y ${pkgs.join(' ')}`);
  }
  log(`Installing ${pkgs.join(' ')} with apt (${why})…`);
  run('apt-get', ['update', '-qq']);
  run('apt-get', ['install', '-y', '-qq', ...pkgs], { env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
}

/** The directory holding initdb, pg_ctl and postgres from Debian's postgresql package. */
export function ensurePostgres() {
  const find = () => {
    if (process.env.PG_BIN && existsSync(path.join(process.env.PG_BIN, 'initdb'))) return process.env.PG_BIN;
    const base = '/usr/lib/postgresql';
    if (!existsSync(base)) return null;
    const versions = readdirSync(base)
      .filter((v) => existsSync(path.join(base, v, 'bin', 'initdb')))
      .sort((a, b) => Number(b) - Number(a));
    return versions.length ? path.join(base, versions[0], 'bin') : null;
  };
  let bin = find();
  if (!bin) {
    aptInstall(['postgresql'], "PostgreSQL's server (Debian package postgresql)");
    bin = find();
  }
  if (!bin) throw new Error('PostgreSQL was installed but initdb was not found under /usr/lib/postgresql/*/bin');
  return bin;
}

export function ensureChromium() {
  const exe = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
  if (existsSync(exe)) return exe;
  aptInstall(['chromium'], 'Chromium for the browser tests (Debian package chromium)');
  return exe;
}

/** poppler-utils (pdftotext, pdfinfo, pdffonts) for the tests that read the report's PDF back. */
export function ensurePoppler() {
  if (existsSync('/usr/bin/pdftotext')) return;
  aptInstall(['poppler-utils'], 'poppler-utils for the PDF tests (Debian package poppler-utils)');
}

/** Run a PostgreSQL binary as the unprivileged `postgres` user when we are root (initdb refuses root). */
function pgCommand(bin, tool, args) {
  const exe = path.join(bin, tool);
  return isRoot ? ['runuser', ['-u', 'postgres', '--', exe, ...args]] : [exe, args];
}

export function pg(bin, tool, args, opts = {}) {
  const [cmd, argv] = pgCommand(bin, tool, args);
  return quiet(cmd, argv, opts);
}

/**
 * A cluster in `dir` (created when missing), listening on 127.0.0.1:`port` only, with its socket
 * inside `dir`. Returns a handle with stop().
 */
export async function startCluster({ bin, dir, port, throwaway = false }) {
  mkdirSync(path.join(dir, 'sock'), { recursive: true });
  if (isRoot) {
    spawnSync('chown', ['-R', 'postgres:postgres', dir]);
  }
  const data = path.join(dir, 'data');
  if (!existsSync(path.join(data, 'PG_VERSION'))) {
    log(`Creating a PostgreSQL cluster in ${path.relative(root, data) || data}…`);
    const res = pg(bin, 'initdb', ['-D', data, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    if (res.status !== 0) throw new Error(`initdb failed:\n${res.stderr}${res.stdout}`);
  }
  if ((await portAnswers(port)) && !(await clusterIsOurs(bin, data))) {
    throw new Error(`Port ${port} is taken by another program. Set PG_PORT to a free port.`);
  }
  // A cluster that was already running (another `npm start`) is used but left running on stop.
  const startedHere = !(await clusterIsOurs(bin, data));
  if (startedHere) {
    const opts = [`-k ${path.join(dir, 'sock')}`, `-p ${port}`, `-h 127.0.0.1`];
    if (throwaway) opts.push('-c fsync=off -c synchronous_commit=off -c full_page_writes=off');
    const res = pg(bin, 'pg_ctl', ['-D', data, '-l', path.join(dir, 'server.log'), '-w', '-t', '60', '-o', opts.join(' '), 'start']);
    if (res.status !== 0) {
      const tail = existsSync(path.join(dir, 'server.log')) ? readFileSync(path.join(dir, 'server.log'), 'utf8').slice(-2000) : '';
      throw new Error(`PostgreSQL did not start:\n${res.stderr}${res.stdout}\n${tail}`);
    }
  }
  return {
    port,
    startedHere,
    stop() {
      if (startedHere) pg(bin, 'pg_ctl', ['-D', data, '-m', 'fast', '-w', 'stop']);
    },
  };
}

async function clusterIsOurs(bin, data) {
  return pg(bin, 'pg_ctl', ['-D', data, 'status']).status === 0;
}

export function psql(bin, port, sql, db = 'postgres') {
  const res = pg(bin, 'psql', ['-h', '127.0.0.1', '-p', String(port), '-U', 'postgres', '-d', db, '-v', 'ON_ERROR_STOP=1', '-tAc', sql]);
  if (res.status !== 0) throw new Error(`psql failed (${sql}): ${res.stderr}`);
  return res.stdout.trim();
}

/** Creates the login role and database when missing; returns the connection URL. */
export function ensureDatabase(bin, port, name, role = 'proving_ground') {
  if (psql(bin, port, `SELECT 1 FROM pg_roles WHERE rolname = '${role}'`) !== '1') {
    psql(bin, port, `CREATE ROLE ${role} LOGIN`);
  }
  if (psql(bin, port, `SELECT 1 FROM pg_database WHERE datname = '${name}'`) !== '1') {
    psql(bin, port, `CREATE DATABASE ${name} OWNER ${role}`);
  }
  return `postgres://${role}@127.0.0.1:${port}/${name}`;
}

export function portAnswers(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}

export function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
    server.once('error', reject);
  });
}

export async function waitForHttp(url, timeoutMs = 120_000) {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    try {
      const res = await fetch(url);
      if (res.status < 500) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

/** A development session secret, generated once and kept in a git-ignored file. */
export function ensureDevSecret() {
  const file = path.join(root, '.data', 'session-secret');
  if (!existsSync(file)) {
    mkdirSync(path.dirname(file), { recursive: true });
    const bytes = new Uint8Array(48);
    crypto.getRandomValues(bytes);
    writeFileSync(file, Buffer.from(bytes).toString('base64url'), { mode: 0o600 });
  }
  return readFileSync(file, 'utf8').trim();
}

export function spawnChild(cmd, args, opts = {}) {
  return spawn(cmd, args, { cwd: root, stdio: 'inherit', ...opts });
}

/** The environment `next start` runs with: the method guard preloaded (see scripts/http-guard.cjs). */
export function serverEnv(env) {
  const guard = `--require ${path.join(root, 'scripts', 'http-guard.cjs')}`;
  return { ...env, NODE_OPTIONS: [env.NODE_OPTIONS, guard].filter(Boolean).join(' ') };
}

export function knex(args, env) {
  run(path.join(root, 'node_modules', '.bin', 'knex'), ['--knexfile', 'knexfile.ts', ...args], {
    env: { ...process.env, ...env, NODE_OPTIONS: '--import=tsx' },
  });
}

export { chownSync };

/**
 * The local fakes (scripts/fakes.mjs) in a child process: an S3 store with its data in `s3Dir` and
 * an SMTP sink writing into `mailDir`, on free loopback ports. A fake is not started when its
 * service is configured from outside (S3_ENDPOINT, SMTP_HOST). Returns { env, stop }: `env` holds
 * the S3_* / SMTP_* / MAIL_* variables for the app and the tests.
 */
export async function startFakes({ s3Dir, mailDir }) {
  const { fakesEnv } = await import('./fakes.mjs');
  const wantS3 = !process.env.S3_ENDPOINT;
  const wantSmtp = !process.env.SMTP_HOST;
  if (!wantS3 && !wantSmtp) return { env: {}, stop() {} };
  const args = [path.join(root, 'scripts', 'fakes.mjs')];
  if (wantS3) args.push('--s3-port', String(await freePort()), '--s3-dir', s3Dir);
  if (wantSmtp) args.push('--smtp-port', String(await freePort()), '--mail-dir', mailDir);
  const child = spawn(process.execPath, args, { cwd: root, stdio: ['pipe', 'pipe', 'inherit'] });
  const ready = await new Promise((resolve, reject) => {
    let out = '';
    child.stdout.on('data', (chunk) => {
      out += chunk;
      const line = out.split('\n')[0];
      if (out.includes('\n')) resolve(JSON.parse(line));
    });
    child.once('exit', (code) => reject(new Error(`The local fakes (scripts/fakes.mjs) exited with ${code}`)));
  });
  log(
    [
      wantS3 && `S3 fake on 127.0.0.1:${ready.s3Port}`,
      wantSmtp && `SMTP sink on 127.0.0.1:${ready.smtpPort} → ${path.relative(root, mailDir) || mailDir}`,
    ]
      .filter(Boolean)
      .join(', '),
  );
  return {
    env: fakesEnv({ s3Port: ready.s3Port, smtpPort: ready.smtpPort, mailDir }),
    stop() {
      if (child.exitCode === null) child.kill('SIGTERM');
    },
  };
}
