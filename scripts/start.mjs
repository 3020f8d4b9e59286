// `npm start`: from a fresh clone to a running, seeded Lanewise on http://127.0.0.1:3000.
import {
  bin,
  buildIfStale,
  ensureNpmPackages,
  migrate,
  profileSettings,
  runStep,
  startAppServices,
  startDatabase,
  stopServices,
} from './setup.mjs';

async function main() {
  ensureNpmPackages();
  await startDatabase('dev');
  const settings = profileSettings('dev');
  migrate(settings.env);
  if (runStep('seed', bin('tsx'), ['seed/seed.ts'], settings.env) !== 0)
    throw new Error('seeding failed');
  buildIfStale(settings.env);
  await startAppServices(settings);
  console.log(`
  Lanewise is running: ${settings.url}
  Demo sign-in (password lanewise-demo): owner@harborridge.example, editor@…, viewer@…, admin@harborridge.example
  Stop with Ctrl-C (MariaDB keeps running; \`node db/server.mjs stop\` stops it).
`);
}

const shutdown = () => {
  stopServices();
  process.exit(0);
};
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);

main().catch((e) => {
  console.error(`[start] ${e.message}`);
  stopServices();
  process.exit(1);
});
