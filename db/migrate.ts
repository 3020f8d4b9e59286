import { migrate } from 'drizzle-orm/mysql2/migrator';
import { db, closeDb } from './client';

/** Applies the committed drizzle-kit migrations in db/migrations. */
async function main() {
  await migrate(db, { migrationsFolder: 'db/migrations' });
  await closeDb();
  console.log('[db] migrations applied');
}

main().catch(async (e) => {
  console.error('[db] migration failed:', e instanceof Error ? e.message : e);
  await closeDb();
  process.exit(1);
});
