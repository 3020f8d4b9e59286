import { OrderingWorkspace } from '@/components/ordering/ordering-workspace';
import { PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';

export default async function ArmsPage({
  params,
  searchParams,
}: {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<{ analysis?: string | string[] }>;
}) {
  const { projectId } = await params;
  const { analysis } = await searchParams;
  const { role } = await pageProjectRole(projectId);
  return (
    <>
      <PageHeader
        title="Arms & ordering"
        lead="Place the complexes of a link run in the Galaxy with distances drawn as distributions, and measure where gas and young stars sit across the spiral arms: ahead of or behind the ridges in the sense of rotation, at the tangent points, and in the longitude–velocity plane."
      />
      <OrderingWorkspace
        projectId={projectId}
        canEdit={roleAtLeast(role, 'editor')}
        isOwner={role === 'owner'}
        analysisId={typeof analysis === 'string' && analysis ? analysis : null}
      />
    </>
  );
}
