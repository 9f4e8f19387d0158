/**
 * The four roles and their names, without zod, so the app shell (layout,
 * navigation, guards) stays out of the validation library's weight. Kept equal
 * to `roles` / `roleLabels` of shared/api/auth.ts (tests/client/components.test.tsx checks).
 */
import type { Role } from '@shared/api/auth';

export type { Role };

export const roles = ['owner', 'lead', 'tech', 'writer'] as const satisfies readonly Role[];

// Compile-time check that no role is missing from the list above.
type Missing = Exclude<Role, (typeof roles)[number]>;
const _complete: Missing extends never ? true : never = true;
void _complete;

export const roleLabels: Record<Role, string> = {
  owner: 'Shop owner',
  lead: 'Lead technician',
  tech: 'Technician',
  writer: 'Service writer',
};
