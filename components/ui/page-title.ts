import type { Metadata } from 'next';
import { pageProjectRole } from '@/lib/auth/page-user';
import { getCatalog } from '@/lib/services/catalogs';
import { getRun } from '@/lib/services/link-runs';
import { getProject } from '@/lib/services/projects';

/**
 * The browser title of a project page: "Section · run or catalog name · project" (the root layout
 * appends "· Lanewise"). Only members reach it (the same check as the page); a run or catalog of
 * another project never lends its name.
 */
export async function projectPageTitle(
  projectId: string,
  section: string | null,
  of: { runId?: string; catalogId?: string } = {},
): Promise<Metadata> {
  const { role } = await pageProjectRole(projectId);
  const project = await getProject(projectId, role);
  const item = of.runId
    ? await getRun(of.runId).catch(() => null)
    : of.catalogId
      ? await getCatalog(of.catalogId).catch(() => null)
      : null;
  const parts = [section, item?.projectId === projectId ? item.name : null, project.name];
  return { title: parts.filter((p): p is string => !!p).join(' · ') };
}
