import { projectPageTitle } from '@/components/ui/page-title';
import { TeamManager } from '@/components/forms/team-manager';
import { PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';

export async function generateMetadata({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  return projectPageTitle(projectId, 'Team');
}

export default async function TeamPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const { user, role } = await pageProjectRole(projectId);
  return (
    <>
      <PageHeader
        title="Team"
        lead="Owners invite people and set roles. Editors upload, run and review; viewers read and export."
      />
      <TeamManager projectId={projectId} myId={user.id} isOwner={role === 'owner'} />
    </>
  );
}
