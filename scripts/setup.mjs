// Shared set-up of `npm start` and `npm test`: everything a fresh machine lacks is installed
// here (npm packages, MariaDB, Chromium for tests), then the private services are started.
// Plain Node with no dependencies, because it runs before `npm install` has.
import { spawn, spawnSync, execFileSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import net from 'node:net';
import { fileURLToPath } from 'node:url';
import { dbProfile, startDb } from '../db/server.mjs';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const bin = (name) => path.join(root, 'node_modules', '.bin', name);

/** Installs npm packages when node_modules is missing or older than the lock file. */
export function ensureNpmPackages() {
  const lock = path.join(root, 'package-lock.json');
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const stale =
    !fs.existsSync(marker) ||
    (fs.existsSync(lock) && fs.statSync(lock).mtimeMs > fs.statSync(marker).mtimeMs + 1000);
  if (!stale) return;
  console.log('[setup] installing npm packages …');
  const args = fs.existsSync(lock)
    ? ['ci', '--no-audit', '--no-fund']
    : ['install', '--no-audit', '--no-fund'];
  execFileSync('npm', args, { cwd: root, stdio: 'inherit' });
}

/**
 * Debian packages the tests use, each known by a file it installs: Chromium for the end-to-end
 * tests, and python3-astropy, the independent VOTable reader of the export tests (called as
 * /usr/bin/python3: a python3 earlier on PATH may not be Debian's).
 */
const TEST_PACKAGES = {
  chromium: '/usr/bin/chromium',
  'python3-astropy': '/usr/lib/python3/dist-packages/astropy/io/votable/__init__.py',
};

/** Installs the missing test packages (as root with apt-get); returns Chromium's path. */
export function ensureTestPackages() {
  const missing = Object.keys(TEST_PACKAGES).filter((p) => !fs.existsSync(TEST_PACKAGES[p]));
  if (!missing.length) return TEST_PACKAGES.chromium;
  if (process.getuid?.() !== 0) {
    throw new Error(
      `Test packages are missing: install them with sudo apt-get install -y ${missing.join(' ')}`,
    );
  }
  console.log(`[setup] installing ${missing.join(', ')} with apt-get …`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update'], { stdio: 'inherit', env });
  execFileSync('apt-get', ['install', '-y', '--no-install-recommends', ...missing], {
    stdio: 'inherit',
    env,
  });
  return TEST_PACKAGES.chromium;
}

/** Local secrets, generated on first start and kept (git-ignored) with the profile's data. */
function localSecret(dir) {
  const file = path.join(dir, 'secrets.json');
  if (!fs.existsSync(file)) {
    fs.mkdirSync(dir, { recursive: true });
    fs.writeFileSync(
      file,
      JSON.stringify({ NEXTAUTH_SECRET: crypto.randomBytes(32).toString('base64url') }),
      { mode: 0o600 },
    );
  }
  return JSON.parse(fs.readFileSync(file, 'utf8'));
}

/** Ports and directories of a profile; `test` never shares anything with `dev`. */
export function profileSettings(profile) {
  const isTest = profile === 'test';
  const db = dbProfile(profile);
  const slot = isTest ? Number(process.env.LANEWISE_TEST_SLOT ?? 0) : 0;
  const appPort = Number(
    isTest ? (process.env.LANEWISE_TEST_PORT ?? 3100 + slot * 10) : (process.env.PORT ?? 3000),
  );
  const mailPort = Number(
    isTest
      ? (process.env.LANEWISE_TEST_MAIL_PORT ?? 2625 + slot * 10)
      : (process.env.MAIL_CATCHER_PORT ?? 2525),
  );
  const url = `http://127.0.0.1:${appPort}`;
  const secrets = localSecret(db.dir);
  const env = {
    ...process.env,
    DATABASE_URL: db.url,
    NEXTAUTH_URL: url,
    NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? secrets.NEXTAUTH_SECRET,
    SMTP_URL: `smtp://127.0.0.1:${mailPort}`,
    MAIL_CATCHER_PORT: String(mailPort),
    MAIL_CATCHER_DIR: path.join(db.dir, 'mail'),
    LANEWISE_DATA_DIR: path.join(db.dir, 'files'),
    LANEWISE_MODE: process.env.LANEWISE_MODE ?? 'local',
    // Tests check the 413 of the upload limit without sending half a gigabyte.
    // Tests kill a worker on purpose; its job is picked up again after this many seconds.
    WORKER_STALE_SECONDS: isTest ? '6' : (process.env.WORKER_STALE_SECONDS ?? '30'),
    // Tests see the end-of-run e-mail without waiting a minute for it.
    RUN_NOTICE_AFTER_SECONDS: isTest ? '0' : (process.env.RUN_NOTICE_AFTER_SECONDS ?? '60'),
    UPLOAD_LIMIT_MB: isTest ? '5' : (process.env.UPLOAD_LIMIT_MB ?? '512'),
    NEXT_DIST_DIR: isTest ? (slot ? `.next-test-${slot}` : '.next-test') : '.next',
    NEXT_TELEMETRY_DISABLED: '1',
  };
  return { profile, db, appPort, mailPort, url, env };
}

export async function startDatabase(profile) {
  return startDb(profile);
}

export function runStep(label, cmd, args, env) {
  console.log(`[${label}] ${[path.basename(cmd), ...args].join(' ')}`);
  const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit', env });
  return r.status ?? 1;
}

/**
 * Like runStep, but without blocking this process: the services it started keep having their
 * output read (a full pipe would stall them) and are restarted if they die.
 */
export function runStepAsync(label, cmd, args, env) {
  console.log(`[${label}] ${[path.basename(cmd), ...args].join(' ')}`);
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { cwd: root, stdio: 'inherit', env });
    child.on('exit', (code) => resolve(code ?? 1));
  });
}

export function migrate(env) {
  if (runStep('db', bin('tsx'), ['db/migrate.ts'], env) !== 0) throw new Error('migrations failed');
}

function newestMtime(dir) {
  let newest = 0;
  if (!fs.existsSync(dir)) return 0;
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    newest = Math.max(newest, e.isDirectory() ? newestMtime(p) : fs.statSync(p).mtimeMs);
  }
  return newest;
}

/** Builds the app when there is no build yet or a source file is newer than it. */
export function buildIfStale(env) {
  const distDir = path.join(root, env.NEXT_DIST_DIR);
  const buildId = path.join(distDir, 'BUILD_ID');
  const built = fs.existsSync(buildId) ? fs.statSync(buildId).mtimeMs : 0;
  const sources = Math.max(
    ...['app', 'components', 'lib', 'db', 'seed'].map((d) => newestMtime(path.join(root, d))),
    ...['package-lock.json', 'next.config.ts', 'postcss.config.mjs'].map((f) =>
      fs.existsSync(path.join(root, f)) ? fs.statSync(path.join(root, f)).mtimeMs : 0,
    ),
  );
  if (built > sources) return;
  if (runStep('build', bin('next'), ['build'], env) !== 0) throw new Error('next build failed');
}

const children = new Set();
let stopping = false;

/**
 * Starts a long-running service whose output is prefixed with its name. With `restart`, a
 * service that dies is started again, as a process manager would in production.
 */
export function startService(name, cmd, args, env, { restart = false } = {}) {
  const child = spawn(cmd, args, {
    cwd: root,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  const prefix = (stream, out) => {
    let buf = '';
    stream.on('data', (d) => {
      buf += d.toString();
      const lines = buf.split('\n');
      buf = lines.pop();
      for (const l of lines) out.write(`[${name}] ${l}\n`);
    });
  };
  prefix(child.stdout, process.stdout);
  prefix(child.stderr, process.stderr);
  children.add(child);
  child.on('exit', (code, signal) => {
    children.delete(child);
    if (restart && !stopping) {
      console.log(`[${name}] exited (${signal ?? code}); starting it again`);
      setTimeout(() => !stopping && startService(name, cmd, args, env, { restart }), 500);
    }
  });
  return child;
}

export function stopServices() {
  stopping = true;
  for (const c of children) {
    try {
      process.kill(-c.pid, 'SIGTERM');
    } catch {
      /* already gone */
    }
  }
}

export function waitForPort(port, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  return new Promise((resolve, reject) => {
    const attempt = () => {
      const s = net.connect({ host: '127.0.0.1', port }, () => {
        s.destroy();
        resolve();
      });
      s.on('error', () => {
        if (Date.now() > deadline) reject(new Error(`nothing answered on port ${port}`));
        else setTimeout(attempt, 250);
      });
    };
    attempt();
  });
}

export async function waitForHttp(url, timeoutMs = 90_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      const r = await fetch(url);
      if (r.status < 500) return;
    } catch {
      /* not yet */
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`${url} did not answer`);
}

/** Starts the mail catcher, the worker and the web server of a profile. */
export async function startAppServices(settings) {
  const { env, appPort, mailPort, url } = settings;
  // `node --import tsx` runs TypeScript in one process (the tsx CLI adds a parent process),
  // so a signal to the pid a worker records reaches the worker itself.
  startService('mail', process.execPath, ['--import', 'tsx', 'lib/mail/catcher-main.ts'], env);
  await waitForPort(mailPort);
  startService('worker', process.execPath, ['--import', 'tsx', 'lib/jobs/main.ts'], env, {
    restart: true,
  });
  startService('web', bin('next'), ['start', '-H', '127.0.0.1', '-p', String(appPort)], env);
  await waitForHttp(`${url}/api/health`);
}

export { bin };
