import { PROJECT_ROLES } from '@/db/schema';

export type ProjectRole = (typeof PROJECT_ROLES)[number];

const RANK: Record<ProjectRole, number> = { viewer: 1, editor: 2, owner: 3 };

/** True when `role` is at least `min` (owner ⊃ editor ⊃ viewer). */
export const roleAtLeast = (role: ProjectRole, min: ProjectRole) => RANK[role] >= RANK[min];
