/**
 * The navigation registry. Each entry shows for the roles it lists.
 * To add a page to the menu, add ONE line here, e.g.
 *   { to: '/pin-cards', label: 'Pin cards', roles: ['owner', 'lead', 'tech'], group: 'work', description: 'Open a connector and see what each cavity should read.' },
 * Entries show in this order within their group ('work' first, then 'shop').
 * `description` is the line the Home page shows beside the link.
 */
import { roles as allRoleList, type Role } from '@/lib/roles';
import type { Meta } from '@/lib/me';

export interface NavEntry {
  to: string;
  label: string;
  roles: readonly Role[];
  group: 'work' | 'shop';
  description?: string;
  /** Shown only when the server offers this (from /api/meta). */
  requires?: 'outbox';
  /** Match `to` exactly (for '/'). */
  end?: boolean;
}

export const everyone: readonly Role[] = allRoleList;

export const navigation: NavEntry[] = [
  { to: '/', label: 'Home', roles: everyone, group: 'work', end: true },
  { to: '/harnesses', label: 'Harnesses', roles: ['owner', 'lead'], group: 'work', description: 'Draw and edit harnesses, publish them for the shop.' },
  { to: '/pin-cards', label: 'Find a connector', roles: ['tech', 'lead', 'owner'], group: 'work', description: 'Search a circuit, colour or function; open a pin card with what each cavity should read.' },
  { to: '/walk', label: 'Walk a circuit', roles: ['tech', 'lead', 'owner'], group: 'work', description: 'Follow a circuit between two points, take readings, see the suspects.' },
  { to: '/bus', label: 'Bus messages', roles: ['tech', 'lead', 'owner'], group: 'work', description: 'What each controller sends on the bus; compare two captures to find the byte a control moves.' },
  { to: '/repair-orders', label: 'Repair orders', roles: ['writer', 'lead', 'owner'], group: 'work', description: 'Open, assign and follow jobs; send the customer the report.' },
  { to: '/repair-orders?techId=me', label: 'My orders', roles: ['tech'], group: 'work', description: 'The jobs assigned to you: findings, photos, drawings, time.' },
  { to: '/customers', label: 'Customers', roles: ['writer', 'lead', 'owner'], group: 'work', description: 'Customers, their contacts, machines and attachments.' },
  { to: '/procedures', label: 'Procedures', roles: ['lead', 'owner'], group: 'shop', description: 'Checklists to attach to orders, and when an order counts as stalled.' },
  { to: '/people', label: 'People', roles: ['owner'], group: 'shop', description: 'Invite people by e-mail, set their roles, remove them.' },
  { to: '/outbox', label: 'Outbox', roles: ['owner'], group: 'shop', requires: 'outbox', description: 'Read the e-mails Wirewalk sent while no mail server is set up.' },
  { to: '/account', label: 'Account', roles: everyone, group: 'shop', description: 'Your name, your password, bench or bay mode.' },
];

const groupOrder = { work: 0, shop: 1 } as const;

/** The entries a person of `role` sees, given what the server offers. */
export function navigationFor(role: Role | null, meta: Pick<Meta, 'outbox'> | null, entries: readonly NavEntry[] = navigation): NavEntry[] {
  if (!role) return [];
  return entries
    .map((entry, index) => ({ entry, index }))
    .filter(({ entry }) => entry.roles.includes(role) && (entry.requires !== 'outbox' || meta?.outbox === true))
    .sort((a, b) => groupOrder[a.entry.group] - groupOrder[b.entry.group] || a.index - b.index)
    .map(({ entry }) => entry);
}
