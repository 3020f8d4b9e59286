// `npm test`: the same set-up as `npm start` on its own ports and data directory (never the
// demo data), then typecheck, lint, formatting, and every test: unit, integration against the real MariaDB
// and the running app, end-to-end in Debian's Chromium. Stops what it started.
import fs from 'node:fs';
import path from 'node:path';
import { stopDb, resetDb } from '../db/server.mjs';
import {
  bin,
  buildIfStale,
  ensureTestPackages,
  ensureNpmPackages,
  migrate,
  profileSettings,
  root,
  runStep,
  runStepAsync,
  startAppServices,
  startDatabase,
  stopServices,
} from './setup.mjs';

async function main() {
  ensureNpmPackages();
  const chromium = ensureTestPackages();
  await startDatabase('test');
  resetDb('test');
  const settings = profileSettings('test');
  fs.rmSync(settings.env.MAIL_CATCHER_DIR, { recursive: true, force: true });
  fs.rmSync(settings.env.LANEWISE_DATA_DIR, { recursive: true, force: true });
  migrate(settings.env);
  const env = { ...settings.env, LANEWISE_BASE_URL: settings.url, CHROMIUM_PATH: chromium };

  const failures = [];
  if (runStep('typecheck', bin('tsc'), ['--noEmit'], env) !== 0) failures.push('typecheck');
  if (runStep('lint', bin('eslint'), ['.', '--max-warnings=0'], env) !== 0) failures.push('lint');
  if (runStep('format', bin('prettier'), ['--check', '.'], env) !== 0)
    failures.push('format (npm run format fixes it)');
  buildIfStale(env);
  await startAppServices(settings);

  const report = path.join(settings.db.dir, 'vitest.json');
  const only = process.argv.slice(2);
  const status = await runStepAsync(
    'vitest',
    bin('vitest'),
    ['run', '--reporter=default', '--reporter=json', `--outputFile=${report}`, ...only],
    env,
  );
  if (status !== 0) failures.push('tests');
  if (fs.existsSync(report)) {
    const r = JSON.parse(fs.readFileSync(report, 'utf8'));
    console.log(`\nvitest: ${r.numPassedTests} passed, ${r.numFailedTests} failed`);
    if (r.numTotalTests === 0) failures.push('no tests ran');
  }
  return failures;
}

let code = 1;
main()
  .then((failures) => {
    code = failures.length ? 1 : 0;
    console.log(failures.length ? `\nFAILED: ${failures.join(', ')}` : '\nAll checks passed.');
  })
  .catch((e) => console.error(`[test] ${e.stack ?? e}`))
  .finally(async () => {
    stopServices();
    await stopDb('test').catch(() => undefined);
    void root;
    process.exit(code);
  });
