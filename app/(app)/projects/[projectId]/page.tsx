import { projectPageTitle } from '@/components/ui/page-title';
import Link from 'next/link';
import { PageHeader, Panel } from '@/components/ui/panel';
import { pageProjectRole } from '@/lib/auth/page-user';
import { getProject } from '@/lib/services/projects';
import { listMembers } from '@/lib/services/members';

export async function generateMetadata({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  return projectPageTitle(projectId, null);
}

export default async function ProjectOverview({
  params,
}: {
  params: Promise<{ projectId: string }>;
}) {
  const { projectId } = await params;
  const { role } = await pageProjectRole(projectId);
  const project = await getProject(projectId, role);
  const { members } = await listMembers(projectId);
  const steps = [
    [
      'catalogs',
      'Upload catalogs',
      'CSV, TSV or VOTable files of HI and CO clouds, HII regions and OB associations.',
    ],
    [
      'link-runs',
      'Start a link run',
      'Link tracers by position and velocity, group them into complexes, estimate chance links.',
    ],
    ['complexes', 'Review complexes', 'Accept, doubt or reject each complex with a note.'],
    [
      'arms',
      'Measure the ordering',
      'Kinematic distances, arm models and offsets of gas and young stars across the arms.',
    ],
  ] as const;
  return (
    <>
      <PageHeader
        title={project.name}
        lead={project.description ?? `You are ${role} of this project.`}
      />
      <div className="grid gap-4 md:grid-cols-2">
        {steps.map(([href, title, text], i) => (
          <Link
            key={href}
            href={`/projects/${projectId}/${href}`}
            className="rounded-lg border border-rule bg-white/70 p-4 hover:border-accent"
          >
            <p className="text-xs font-semibold text-accent">Step {i + 1}</p>
            <p className="font-medium">{title}</p>
            <p className="mt-1 text-sm text-ink-soft">{text}</p>
          </Link>
        ))}
      </div>
      <Panel title="Team" className="mt-6">
        <p className="text-sm">
          {members.length} member{members.length === 1 ? '' : 's'}:{' '}
          {members.map((m) => `${m.name} (${m.role})`).join(', ')}
        </p>
      </Panel>
    </>
  );
}
