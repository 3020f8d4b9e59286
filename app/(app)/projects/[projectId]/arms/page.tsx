import { projectPageTitle } from '@/components/ui/page-title';
import { ExternalWorkspace } from '@/components/external/external-workspace';
import { projectTarget } from '@/components/external/target';
import { OrderingWorkspace } from '@/components/ordering/ordering-workspace';
import { PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';
import { analysisProject } from '@/lib/services/analyses';
import { getProject } from '@/lib/services/projects';
import { requireInProject } from '../require-in-project';

export async function generateMetadata({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  return projectPageTitle(projectId, 'Arms & ordering');
}

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
  const target = projectTarget((await getProject(projectId, role)).settings);
  const analysisId = typeof analysis === 'string' && analysis ? analysis : null;
  if (analysisId) await requireInProject(projectId, () => analysisProject(analysisId));
  if (target.kind === 'external-galaxy')
    return (
      <>
        <PageHeader
          title="Arms & ordering"
          lead={`Deproject the sources of ${target.name || 'the galaxy'} into its disc and measure, ring by ring, the azimuthal offset of young stars from gas in the sense of rotation; fit Δφ(R) = 1.0227·10⁻³ (Ω(R) − Ω_p) t for the pattern speed and the timescale, with a null test for whether any offset is there at all.`}
        />
        <ExternalWorkspace
          projectId={projectId}
          target={target}
          canEdit={roleAtLeast(role, 'editor')}
          analysisId={analysisId}
        />
      </>
    );
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
        analysisId={analysisId}
      />
    </>
  );
}
