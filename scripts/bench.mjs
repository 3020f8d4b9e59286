// `npm run bench:ingest` (and other benchmarks that need MariaDB): starts a private database
// of its own (test slot 3, reset each time), migrates, and runs the benchmark script with tsx.
// With `--app` first (bench:load) it also builds the app if stale and starts its web server on
// the slot's port, passing LANEWISE_BASE_URL; no worker runs, so the benchmark's own seeding is
// the only thing that touches jobs.
import { resetDb } from '../db/server.mjs';
import {
  bin,
  buildIfStale,
  ensureNpmPackages,
  migrate,
  profileSettings,
  runStep,
  startDatabase,
  startService,
  stopServices,
  waitForHttp,
} from './setup.mjs';

process.env.LANEWISE_TEST_SLOT = process.env.LANEWISE_TEST_SLOT ?? '3';
const withApp = process.argv[2] === '--app';
const [script, ...args] = process.argv.slice(withApp ? 3 : 2);
ensureNpmPackages();
await startDatabase('test');
resetDb('test');
const settings = profileSettings('test');
migrate(settings.env);
// No run-end e-mails: no mail catcher runs beside a benchmark.
const env = { ...settings.env, UPLOAD_LIMIT_MB: '2048', RUN_NOTICE_AFTER_SECONDS: '86400' };
if (withApp) {
  buildIfStale(env);
  startService(
    'web',
    bin('next'),
    ['start', '-H', '127.0.0.1', '-p', String(settings.appPort)],
    env,
  );
  await waitForHttp(`${settings.url}/api/health`);
  env.LANEWISE_BASE_URL = settings.url;
}
const status = runStep('bench', bin('tsx'), [script, ...args], env);
stopServices();
process.exit(status);
