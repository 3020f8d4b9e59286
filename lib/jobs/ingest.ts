import { failIngest, ingestCatalog } from '@/lib/services/catalog-ingest';
import { registerJobHandler } from './handlers';

const catalogIdOf = (payload: Record<string, unknown>) => String(payload.catalogId);

registerJobHandler('ingest', {
  run: ({ job, progress }) => ingestCatalog(catalogIdOf(job.payload), progress),
  cleanup: (job, reason) => failIngest(catalogIdOf(job.payload), reason),
});
