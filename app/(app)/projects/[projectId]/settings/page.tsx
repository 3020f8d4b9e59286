import { projectPageTitle } from '@/components/ui/page-title';
import { TargetSettings } from '@/components/external/target-settings';
import { ProjectSettingsForm } from '@/components/forms/project-settings-form';
import { PageHeader } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';
import { getProject } from '@/lib/services/projects';

export async function generateMetadata({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  return projectPageTitle(projectId, 'Settings');
}

export default async function SettingsPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const { role } = await pageProjectRole(projectId);
  const project = await getProject(projectId, role);
  return (
    <>
      <PageHeader
        title="Settings"
        lead={
          role === 'owner'
            ? 'Name, description, target (the Milky Way or an external galaxy) and removal of the project.'
            : 'Only owners change these settings.'
        }
      />
      <ProjectSettingsForm
        project={{ id: project.id, name: project.name, description: project.description ?? '' }}
        canEdit={role === 'owner'}
      >
        <TargetSettings
          projectId={project.id}
          savedTarget={project.settings.target}
          canEdit={role === 'owner'}
        />
      </ProjectSettingsForm>
    </>
  );
}
