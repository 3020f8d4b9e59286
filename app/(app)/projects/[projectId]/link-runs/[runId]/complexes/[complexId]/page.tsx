import { projectPageTitle } from '@/components/ui/page-title';
import { ComplexDetail } from '@/components/link-runs/complex-detail';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';
import { complexIdSchema } from '@/lib/schemas/complexes';
import { complexProject } from '@/lib/services/complexes';
import { notFound } from 'next/navigation';
import { requireInProject } from '../../../../require-in-project';

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
  // Only a plain decimal id names a complex ("abc", "1e3" and "-1" name none).
  const id = /^\d{1,9}$/.test(complexId) ? complexIdSchema.parse(complexId) : null;
  if (id === null) notFound();
  await requireInProject(projectId, () => complexProject(runId, id));
  return (
    <ComplexDetail
      projectId={projectId}
      runId={runId}
      complexId={complexId}
      canEdit={roleAtLeast(role, 'editor')}
    />
  );
}
