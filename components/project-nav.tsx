'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import { useState } from 'react';
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

/**
 * The project's sections, and under its name what it studies (set in Settings → Target). Below
 * 900 px the list folds behind a menu button and folds again when a section is opened.
 */
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
  // Open for the page it was opened on only, so following a link closes it.
  const [openOn, setOpenOn] = useState<string | null>(null);
  const open = openOn === path;
  return (
    <nav
      aria-label="Project"
      className="shrink-0 border-b border-rule bg-paper-deep/40 px-3 py-2 min-[900px]:w-56 min-[900px]:border-r min-[900px]:border-b-0 min-[900px]:py-5"
    >
      <button
        type="button"
        className="flex w-full items-center justify-between rounded-md px-2 py-1.5 text-sm font-medium min-[900px]:hidden"
        aria-expanded={open}
        aria-controls="project-sections"
        onClick={() => setOpenOn(open ? null : path)}
      >
        <span className="truncate">{projectName}</span>
        <span aria-hidden className="ml-2 text-ink-soft">
          {open ? '✕' : '☰'}
        </span>
        <span className="sr-only">Menu</span>
      </button>
      <div id="project-sections" className={open ? 'block pt-2' : 'hidden min-[900px]:block'}>
        <p className="px-2 text-xs font-semibold text-ink-soft">{projectName}</p>
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
      </div>
    </nav>
  );
}
