import { projectPageTitle } from '@/components/ui/page-title';
import Link from 'next/link';
import { CatalogList } from '@/components/tables/catalog-list';
import { PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';

export async function generateMetadata({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  return projectPageTitle(projectId, 'Catalogs');
}

export default async function CatalogsPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const { role } = await pageProjectRole(projectId);
  const canEdit = roleAtLeast(role, 'editor');
  return (
    <>
      <PageHeader
        title="Catalogs"
        lead="Tracer catalogs of this project, normalised to Galactic l, b and LSR velocity."
        actions={
          canEdit && (
            <Link
              href={`/projects/${projectId}/catalogs/new`}
              className="inline-flex items-center rounded-md bg-accent px-3.5 py-2 text-sm font-medium text-white hover:bg-accent/90"
            >
              Upload catalog
            </Link>
          )
        }
      />
      <CatalogList projectId={projectId} canEdit={canEdit} />
    </>
  );
}
