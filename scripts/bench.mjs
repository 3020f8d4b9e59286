// `npm run bench:ingest` (and other benchmarks that need MariaDB): starts a private database
// of its own (test slot 3, reset each time), migrates, and runs the benchmark script with tsx.
import { resetDb } from '../db/server.mjs';
import {
  bin,
  ensureNpmPackages,
  migrate,
  profileSettings,
  runStep,
  startDatabase,
} from './setup.mjs';

process.env.LANEWISE_TEST_SLOT = process.env.LANEWISE_TEST_SLOT ?? '3';
const [script, ...args] = process.argv.slice(2);
ensureNpmPackages();
await startDatabase('test');
resetDb('test');
const settings = profileSettings('test');
migrate(settings.env);
// No run-end e-mails: no mail catcher runs beside a benchmark.
const env = { ...settings.env, UPLOAD_LIMIT_MB: '2048', RUN_NOTICE_AFTER_SECONDS: '86400' };
process.exit(runStep('bench', bin('tsx'), [script, ...args], env));
