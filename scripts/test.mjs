// `npm test`: the whole suite against a throwaway PostgreSQL cluster that this script creates and
// removes. 1) unit, component and database tests (vitest); 2) the app is built and served on a
// free port, and the HTTP API and browser (playwright-core + Debian's chromium) tests run against it.
// Before both: typecheck, ESLint and Prettier (each counted as one check; skipped with a flag).
// Flags: --unit-only (stage 1), --e2e-only (stage 2). Extra arguments after `--` go to vitest.
import { mkdtempSync, readFileSync, rmSync, existsSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import {
  ensureChromium,
  ensureDatabase,
  ensurePoppler,
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
  startFakes,
  waitForHttp,
} from './lib.mjs';

const args = process.argv.slice(2);
const unitOnly = args.includes('--unit-only');
const e2eOnly = args.includes('--e2e-only');
const passThrough = args.includes('--') ? args.slice(args.indexOf('--') + 1) : [];
const vitest = path.join(root, 'node_modules', '.bin', 'vitest');

const totals = { passed: 0, failed: 0, skipped: 0 };
function count(reportFile) {
  if (!existsSync(reportFile)) return;
  const report = JSON.parse(readFileSync(reportFile, 'utf8'));
  totals.passed += report.numPassedTests ?? 0;
  totals.failed += (report.numFailedTests ?? 0) + (report.numRuntimeErrorTestSuites ?? 0);
  totals.skipped += (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
}

function vitestRun(name, extra, env, tmp) {
  const out = path.join(tmp, `${name}.json`);
  try {
    run(vitest, ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${out}`, ...extra, ...passThrough], { env });
    return true;
  } catch {
    return false;
  } finally {
    count(out);
  }
}

async function main() {
  ensureDependencies();
  const bin = ensurePostgres();
  const chromium = unitOnly ? undefined : ensureChromium();
  ensurePoppler();
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'proving-ground-test-'));
  const pgPort = await freePort();
  const cluster = await startCluster({ bin, dir: tmp, port: pgPort, throwaway: true });
  let app;
  let fakes;
  let ok = true;
  const cleanup = () => {
    if (app && app.exitCode === null) app.kill('SIGTERM');
    fakes?.stop();
    cluster.stop();
    rmSync(tmp, { recursive: true, force: true });
  };
  process.on('SIGINT', () => {
    cleanup();
    process.exit(130);
  });
  try {
    const databaseUrl = ensureDatabase(bin, pgPort, 'proving_ground_test');
    // The S3 store and SMTP sink on loopback, in the throwaway directory (unless configured from outside).
    fakes = await startFakes({ s3Dir: path.join(tmp, 's3'), mailDir: path.join(tmp, 'mail') });
    const env = {
      ...process.env,
      ...fakes.env,
      DATABASE_URL: databaseUrl,
      // A throwaway database; the schema tests create and drop their own databases beside it.
      TEST_PG_ADMIN_URL: `postgres://postgres@127.0.0.1:${pgPort}/postgres`,
      SESSION_SECRET: 'test-secret-test-secret-test-secret-test-secret',
      SEED_DEMO: 'true',
      NEXT_DIST_DIR: process.env.NEXT_DIST_DIR ?? '.next-test',
      CHROMIUM_PATH: chromium ?? '',
    };
    if (!unitOnly && !e2eOnly) {
      // The habits first: they take seconds, and a red one needs no database to show.
      for (const script of ['typecheck', 'lint', 'format:check']) {
        log(`npm run ${script}…`);
        try {
          run('npm', ['run', '--silent', script]);
          totals.passed += 1;
        } catch {
          console.error(`npm run ${script} failed: see above.`);
          totals.failed += 1;
          ok = false;
        }
      }
    }
    log('Migrating and seeding the throwaway database…');
    knex(['migrate:latest'], env);
    knex(['seed:run'], env);

    if (!e2eOnly) {
      log('Unit, component and database tests…');
      ok = vitestRun('unit', [], env, tmp) && ok;
    }
    if (!unitOnly) {
      log('Building the app for the HTTP and browser tests…');
      run(path.join(root, 'node_modules', '.bin', 'next'), ['build'], { env: { ...env, NEXT_TELEMETRY_DISABLED: '1' } });
      const port = await freePort();
      const baseUrl = `http://127.0.0.1:${port}`;
      app = spawnChild(path.join(root, 'node_modules', '.bin', 'next'), ['start', '-H', '127.0.0.1', '-p', String(port)], {
        env: serverEnv({ ...env, APP_URL: baseUrl, NEXT_TELEMETRY_DISABLED: '1' }),
        stdio: ['ignore', 'ignore', 'inherit'],
      });
      await waitForHttp(`${baseUrl}/api/health`);
      log(`HTTP API and browser tests against ${baseUrl}…`);
      ok = vitestRun('e2e', ['--config', 'tests/e2e/vitest.config.ts'], { ...env, BASE_URL: baseUrl }, tmp) && ok;
    }
  } catch (error) {
    console.error(error.message);
    ok = false;
  } finally {
    cleanup();
  }
  console.log(`\ntests: ${totals.passed} passed, ${totals.failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ''}`);
  process.exit(ok && totals.failed === 0 ? 0 : 1);
}

main();
