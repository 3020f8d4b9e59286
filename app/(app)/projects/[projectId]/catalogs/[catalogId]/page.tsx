import { projectPageTitle } from '@/components/ui/page-title';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';
import { catalogProject } from '@/lib/services/catalogs';
import { requireInProject } from '../../require-in-project';
import { CatalogDetail } from './catalog-detail';

export async function generateMetadata({
  params,
}: {
  params: Promise<{ projectId: string; catalogId: string }>;
}) {
  const { projectId, catalogId } = await params;
  return projectPageTitle(projectId, 'Catalog', { catalogId });
}

export default async function CatalogPage({
  params,
}: {
  params: Promise<{ projectId: string; catalogId: string }>;
}) {
  const { projectId, catalogId } = await params;
  const { role } = await pageProjectRole(projectId);
  await requireInProject(projectId, () => catalogProject(catalogId));
  return (
    <CatalogDetail
      projectId={projectId}
      catalogId={catalogId}
      canEdit={roleAtLeast(role, 'editor')}
    />
  );
}
