// `npm start`: everything from a fresh clone to a served app. Installs what is missing, starts the
// project's own PostgreSQL cluster on loopback, migrates, seeds the demo when the database is
// empty, builds when the sources changed, and serves on http://127.0.0.1:3000.
// Ctrl-C stops the app and PostgreSQL. `npm run dev` does the same with `next dev`.
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import {
  ensureDatabase,
  ensureDependencies,
  ensureDevSecret,
  ensurePostgres,
  knex,
  log,
  portAnswers,
  root,
  run,
  serverEnv,
  spawnChild,
  startCluster,
  startFakes,
  waitForHttp,
} from './lib.mjs';

const dev = process.argv.includes('--dev');
const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 3000);
const pgPort = Number(process.env.PG_PORT ?? 54329);

const DEMO_ACCOUNTS = [
  ['apprentice@demo.test', 'apprentice'],
  ['technician@demo.test', 'technician'],
  ['lead@demo.test', 'lead'],
  ['lead2@demo.test', 'lead (second, for reviews)'],
  ['trainer@demo.test', 'trainer'],
  ['admin@demo.test', 'admin'],
  ['admin@other.demo.test', 'admin of the second company'],
  ['technician@other.demo.test', 'technician of the second company'],
];

function newestSource() {
  let newest = 0;
  const walk = (dir) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(p);
      else newest = Math.max(newest, statSync(p).mtimeMs);
    }
  };
  for (const dir of ['app', 'components', 'lib', 'machines', 'db', 'public', 'fonts']) {
    if (existsSync(path.join(root, dir))) walk(path.join(root, dir));
  }
  for (const file of ['package-lock.json', 'next.config.ts', 'tailwind.config.ts', 'proxy.ts']) {
    if (existsSync(path.join(root, file))) newest = Math.max(newest, statSync(path.join(root, file)).mtimeMs);
  }
  return newest;
}

function buildIfNeeded() {
  const buildId = path.join(root, process.env.NEXT_DIST_DIR ?? '.next', 'BUILD_ID');
  if (existsSync(buildId) && statSync(buildId).mtimeMs > newestSource()) {
    log('The build is up to date.');
    return;
  }
  log('Building the app (next build)…');
  run(path.join(root, 'node_modules', '.bin', 'next'), ['build']);
}

async function main() {
  // A second `npm start` while the first serves must not rebuild under it or stop its database.
  if (await portAnswers(port, host)) {
    console.error(
      `\nSomething already answers on http://${host}:${port}: is Proving Ground already running? Stop it with Ctrl-C in its terminal, or set PORT.\n`,
    );
    process.exit(1);
  }
  ensureDependencies();
  const bin = ensurePostgres();
  const cluster = await startCluster({ bin, dir: path.join(root, '.data', 'postgres'), port: pgPort });
  let app;
  let fakes;
  let stopping = false;
  const stop = (code = 0) => {
    if (stopping) return;
    stopping = true;
    log('Stopping…');
    if (app && app.exitCode === null) app.kill('SIGTERM');
    fakes?.stop();
    cluster.stop();
    log(cluster.startedHere ? 'Stopped the app and PostgreSQL.' : 'Stopped the app (PostgreSQL was already running and is left running).');
    process.exit(code);
  };
  process.on('SIGINT', () => stop(0));
  process.on('SIGTERM', () => stop(0));
  try {
    const databaseUrl = process.env.DATABASE_URL ?? ensureDatabase(bin, pgPort, 'proving_ground');
    // The S3 store and SMTP sink on loopback, unless a real bucket / mail server is configured.
    fakes = await startFakes({ s3Dir: path.join(root, '.data', 's3'), mailDir: path.join(root, '.data', 'mail') });
    const env = {
      ...process.env,
      ...fakes.env,
      DATABASE_URL: databaseUrl,
      SESSION_SECRET: process.env.SESSION_SECRET ?? ensureDevSecret(),
      APP_URL: process.env.APP_URL ?? `http://${host}:${port}`,
      SEED_DEMO: process.env.SEED_DEMO ?? 'true',
    };
    log('Migrating the database…');
    knex(['migrate:latest'], env);
    log('Seeding the demo (skipped when the database already has data)…');
    knex(['seed:run'], env);
    if (!dev) buildIfNeeded();
    const nextBin = path.join(root, 'node_modules', '.bin', 'next');
    app = spawnChild(nextBin, [dev ? 'dev' : 'start', '-H', host, '-p', String(port)], { env: serverEnv(env) });
    app.on('exit', (code) => stop(code ?? 0));
    await waitForHttp(`http://${host}:${port}/api/health`);
    console.log(`\n  Proving Ground is up: \x1b[1mhttp://${host}:${port}\x1b[0m\n`);
    console.log('  Demo accounts (password: demo-password — local demo only):');
    for (const [email, role] of DEMO_ACCOUNTS) console.log(`    ${email.padEnd(28)} ${role}`);
    console.log('\n  Ctrl-C stops the app and PostgreSQL.\n');
  } catch (error) {
    console.error(`\n${error.message}\n`);
    stop(1);
  }
}

main();
