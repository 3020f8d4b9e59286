import { projectPageTitle } from '@/components/ui/page-title';
import { ComplexesSection } from '@/components/link-runs/complexes-section';
import { PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';

export async function generateMetadata({
  params,
  searchParams,
}: {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<{ run?: string | string[] }>;
}) {
  const { projectId } = await params;
  const { run } = await searchParams;
  return projectPageTitle(
    projectId,
    'Complexes',
    typeof run === 'string' && run ? { runId: run } : {},
  );
}

export default async function ComplexesPage({
  params,
  searchParams,
}: {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<{ run?: string | string[] }>;
}) {
  const { projectId } = await params;
  const { run } = await searchParams;
  await pageProjectRole(projectId);
  return (
    <>
      <PageHeader
        title="Complexes"
        lead="Groups of linked tracers — gas and young stars that belong together. Sort, filter and open them to review."
      />
      <ComplexesSection projectId={projectId} runId={typeof run === 'string' && run ? run : null} />
    </>
  );
}
