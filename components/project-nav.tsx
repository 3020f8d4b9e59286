'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';

const SECTIONS = [
  ['', 'Overview'],
  ['/catalogs', 'Catalogs'],
  ['/link-runs', 'Link runs'],
  ['/complexes', 'Complexes'],
  ['/arms', 'Arms & ordering'],
  ['/team', 'Team'],
  ['/settings', 'Settings'],
] as const;

export function ProjectNav({ projectId, projectName }: { projectId: string; projectName: string }) {
  const path = usePathname();
  const base = `/projects/${projectId}`;
  return (
    <nav
      aria-label="Project"
      className="w-56 shrink-0 border-r border-rule bg-paper-deep/40 px-3 py-5"
    >
      <p className="mb-4 px-2 text-xs font-semibold uppercase tracking-wider text-ink-soft">
        {projectName}
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
