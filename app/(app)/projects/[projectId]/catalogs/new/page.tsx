import { projectPageTitle } from '@/components/ui/page-title';
import Link from 'next/link';
import { CatalogUpload } from '@/components/forms/catalog-upload/catalog-upload';
import { EmptyState, PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';
import { roleAtLeast } from '@/lib/auth/roles';

export async function generateMetadata({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  return projectPageTitle(projectId, 'Upload catalog');
}

export default async function NewCatalogPage({
  params,
}: {
  params: Promise<{ projectId: string }>;
}) {
  const { projectId } = await params;
  const { role } = await pageProjectRole(projectId);
  return (
    <>
      <PageHeader
        title="Upload catalog"
        lead="Choose a file, check how its columns map to position, velocity, size and distance, then upload. Nothing is kept unless the whole file is read."
      />
      {roleAtLeast(role, 'editor') ? (
        <CatalogUpload projectId={projectId} />
      ) : (
        <EmptyState title="Viewers cannot upload">
          You are a viewer of this project. Ask an owner to make you an editor, or go back to the{' '}
          <Link className="text-accent underline" href={`/projects/${projectId}/catalogs`}>
            catalogs
          </Link>
          .
        </EmptyState>
      )}
    </>
  );
}
