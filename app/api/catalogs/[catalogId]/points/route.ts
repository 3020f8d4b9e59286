import fs from 'node:fs';
import { Readable } from 'node:stream';
import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { catalogProject } from '@/lib/services/catalogs';
import { catalogPoints } from '@/lib/services/catalog-rows';

/** Little-endian Float32 (l, b, v) triples of every row, for the canvas plots. */
export const GET = route<{ catalogId: string }>(async (req, { catalogId }) => {
  await requireProjectRole(await catalogProject(catalogId), 'viewer', req);
  const p = await catalogPoints(catalogId);
  const body = Readable.toWeb(fs.createReadStream(p.path)) as ReadableStream<Uint8Array>;
  return new Response(body, {
    headers: {
      'content-type': 'application/octet-stream',
      'content-length': String(p.bytes),
      'x-point-count': String(p.count),
      'cache-control': 'private, max-age=60',
    },
  });
});
