import { projectPageTitle } from '@/components/ui/page-title';
import Link from 'next/link';
import { RunList } from '@/components/link-runs/run-list';
import { PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';

export async function generateMetadata({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  return projectPageTitle(projectId, 'Link runs');
}

export default async function LinkRunsPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const { role } = await pageProjectRole(projectId);
  const canEdit = roleAtLeast(role, 'editor');
  return (
    <>
      <PageHeader
        title="Link runs"
        lead="Cross-match catalogs by sky position and line-of-sight velocity. Each run keeps its parameters, so any result can be reproduced."
        actions={
          canEdit && (
            <Link
              href={`/projects/${projectId}/link-runs/new`}
              className="inline-flex items-center rounded-md bg-accent px-3.5 py-2 text-sm font-medium text-white hover:bg-accent/90"
            >
              New link run
            </Link>
          )
        }
      />
      <RunList projectId={projectId} canEdit={canEdit} />
    </>
  );
}
