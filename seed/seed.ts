import { closeDb } from '@/db/client';
import { ensureDemoAccounts } from '@/lib/services/seed-accounts';

/** Fills the local database with the demo team and project. Idempotent. */
async function main() {
  const projectId = await ensureDemoAccounts();
  console.log(`[seed] demo project ${projectId} ready`);
  await closeDb();
}

main().catch(async (e) => {
  console.error('[seed] failed:', e instanceof Error ? e.stack : e);
  await closeDb();
  process.exit(1);
});
