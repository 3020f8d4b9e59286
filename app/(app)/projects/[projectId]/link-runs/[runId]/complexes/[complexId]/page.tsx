import { projectPageTitle } from '@/components/ui/page-title';
import { ComplexDetail } from '@/components/link-runs/complex-detail';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';

export async function generateMetadata({
  params,
}: {
  params: Promise<{ projectId: string; runId: string; complexId: string }>;
}) {
  const { projectId, runId, complexId } = await params;
  return projectPageTitle(projectId, `Complex ${complexId}`, { runId });
}

export default async function ComplexPage({
  params,
}: {
  params: Promise<{ projectId: string; runId: string; complexId: string }>;
}) {
  const { projectId, runId, complexId } = await params;
  const { role } = await pageProjectRole(projectId);
  return (
    <ComplexDetail
      projectId={projectId}
      runId={runId}
      complexId={complexId}
      canEdit={roleAtLeast(role, 'editor')}
    />
  );
}
