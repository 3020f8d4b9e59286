import Link from 'next/link';
import { CreateProjectForm } from '@/components/forms/create-project-form';
import { EmptyState, PageHeader, Panel } from '@/components/ui/panel';
import { pageUser } from '@/lib/auth/page-user';
import { listProjectsFor } from '@/lib/services/projects';

export const metadata = { title: 'Projects' };

export default async function ProjectsPage() {
  const user = await pageUser();
  const projects = await listProjectsFor(user.id);
  return (
    <main className="mx-auto w-full max-w-5xl px-6 py-8">
      <PageHeader
        title="Projects"
        lead="Each project holds a team, its catalogs, link runs and ordering analyses."
      />
      <Panel className="mb-6">
        <CreateProjectForm />
      </Panel>
      {projects.length === 0 ? (
        <EmptyState title="No projects yet">
          Create one above, or ask a colleague to invite you to theirs.
        </EmptyState>
      ) : (
        <ul className="divide-y divide-rule rounded-lg border border-rule bg-white/70">
          {projects.map((p) => (
            <li key={p.id}>
              <Link
                href={`/projects/${p.id}`}
                className="flex items-center justify-between px-4 py-3 hover:bg-paper-deep/40"
              >
                <span className="font-medium">{p.name}</span>
                <span className="rounded-full bg-accent-soft px-2 py-0.5 text-xs text-accent">
                  {p.role}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </main>
  );
}
