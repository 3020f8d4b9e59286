import { projectTarget } from '@/components/external/target';
import { ProjectNav } from '@/components/project-nav';
import { pageProjectRole } from '@/lib/auth/page-user';
import { getProject } from '@/lib/services/projects';

export default async function ProjectLayout({
  children,
  params,
}: {
  children: React.ReactNode;
  params: Promise<{ projectId: string }>;
}) {
  const { projectId } = await params;
  const { role } = await pageProjectRole(projectId);
  const project = await getProject(projectId, role);
  return (
    <>
      <ProjectNav
        projectId={projectId}
        projectName={project.name}
        target={projectTarget(project.settings)}
      />
      <main className="min-w-0 flex-1 px-4 py-5 sm:px-8 sm:py-7">{children}</main>
    </>
  );
}
