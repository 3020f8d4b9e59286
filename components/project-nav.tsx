'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import { targetWords } from '@/components/external/target';
import type { ProjectTarget } from '@/lib/schemas/analyses';

const SECTIONS = [
  ['', 'Overview'],
  ['/catalogs', 'Catalogs'],
  ['/link-runs', 'Link runs'],
  ['/complexes', 'Complexes'],
  ['/arms', 'Arms & ordering'],
  ['/team', 'Team'],
  ['/settings', 'Settings'],
] as const;

/** The project's sections, and under its name what it studies (set in Settings → Target). */
export function ProjectNav({
  projectId,
  projectName,
  target,
}: {
  projectId: string;
  projectName: string;
  target: ProjectTarget;
}) {
  const path = usePathname();
  const base = `/projects/${projectId}`;
  const words = targetWords(target);
  return (
    <nav
      aria-label="Project"
      className="w-56 shrink-0 border-r border-rule bg-paper-deep/40 px-3 py-5"
    >
      <p className="px-2 text-xs font-semibold uppercase tracking-wider text-ink-soft">
        {projectName}
      </p>
      <p className="mb-4 mt-1 px-2 text-xs text-ink-soft" data-testid="project-target">
        <span className="font-medium text-ink">{words.title}</span>
        <span className="block">{words.detail}</span>
      </p>
      <ul className="space-y-0.5 text-sm">
        {SECTIONS.map(([suffix, label]) => {
          const href = base + suffix;
          const active = suffix === '' ? path === base : path.startsWith(href);
          return (
            <li key={label}>
              <Link
                href={href}
                className={`block rounded-md px-2 py-1.5 ${active ? 'bg-accent text-white' : 'text-ink hover:bg-paper-deep'}`}
              >
                {label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
