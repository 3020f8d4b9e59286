import { notFound } from 'next/navigation';
import { HttpError } from '@/lib/http/errors';

/**
 * For the pages of one record: Next's not-found page, rendered once on the server, unless
 * `projectOf` finds the record in `projectId` — so a bad or foreign id never reaches a client
 * component that would fetch (and poll) it.
 */
export async function requireInProject(projectId: string, projectOf: () => Promise<string>) {
  const found = await projectOf().catch((e: unknown) => {
    if (e instanceof HttpError && e.status === 404) return null;
    throw e;
  });
  if (found !== projectId) notFound();
}
