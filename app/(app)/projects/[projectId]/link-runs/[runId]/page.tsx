import { projectPageTitle } from '@/components/ui/page-title';
import { RunDetail } from '@/components/link-runs/run-detail';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';
import { runProject } from '@/lib/services/link-runs';
import { requireInProject } from '../../require-in-project';

export async function generateMetadata({
  params,
}: {
  params: Promise<{ projectId: string; runId: string }>;
}) {
  const { projectId, runId } = await params;
  return projectPageTitle(projectId, 'Link run', { runId });
}

export default async function LinkRunPage({
  params,
}: {
  params: Promise<{ projectId: string; runId: string }>;
}) {
  const { projectId, runId } = await params;
  const { role } = await pageProjectRole(projectId);
  await requireInProject(projectId, () => runProject(runId));
  return <RunDetail projectId={projectId} runId={runId} canEdit={roleAtLeast(role, 'editor')} />;
}
