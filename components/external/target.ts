/**
 * A project's target as the pages read it from `project.settings.target`: the Milky Way unless an
 * external galaxy is saved there (an unreadable entry counts as none, so an old project keeps
 * working as it did), and the words that name it.
 */
import { projectTargetSchema, type ProjectTarget } from '@/lib/schemas/analyses';

export type ExternalTarget = Extract<ProjectTarget, { kind: 'external-galaxy' }>;

/** The target saved in a project's settings, or the Milky Way. */
export function projectTarget(settings: Record<string, unknown>): ProjectTarget {
  const parsed = projectTargetSchema.safeParse(settings.target);
  return parsed.success ? parsed.data : { kind: 'milky-way' };
}

/** How the side navigation names the target. */
export function targetWords(target: ProjectTarget): { title: string; detail: string } {
  if (target.kind === 'milky-way')
    return { title: 'Milky Way', detail: 'l, b, v_LSR · kinematic distances' };
  return {
    title: target.name || 'External galaxy',
    detail: `external galaxy at ${target.galaxy.distanceMpc} Mpc · RA/Dec · kpc in the disc`,
  };
}
