import { projectPageTitle } from '@/components/ui/page-title';
import { LinkRunForm } from '@/components/forms/link-run-form';
import { EmptyState, PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';

export async function generateMetadata({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  return projectPageTitle(projectId, 'New link run');
}

export default async function NewLinkRunPage({
  params,
  searchParams,
}: {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<{ from?: string | string[] }>;
}) {
  const { projectId } = await params;
  const { from } = await searchParams;
  const { role } = await pageProjectRole(projectId);
  return (
    <>
      <PageHeader
        title="New link run"
        lead="Link tracers that lie within the match radius on the sky and within the velocity window along the line of sight. Linked sources are grouped into complexes."
      />
      {roleAtLeast(role, 'editor') ? (
        <LinkRunForm
          projectId={projectId}
          fromRunId={typeof from === 'string' && from ? from : null}
        />
      ) : (
        <EmptyState title="Only editors start link runs">
          You can read and export every run of this project. Ask an owner for the editor role to
          start runs of your own.
        </EmptyState>
      )}
    </>
  );
}
