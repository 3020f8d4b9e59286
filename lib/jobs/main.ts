import { closeDb } from '@/db/client';
import { runWorker } from './worker';

runWorker()
  .then(() => closeDb())
  .then(() => process.exit(0))
  .catch((e) => {
    console.error('[worker] stopped:', e);
    process.exit(1);
  });
