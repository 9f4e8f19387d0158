import type { Role } from '../shared/api/auth';
import type { AppDeps } from '../server/deps';
import { newId } from '../server/db/ids';
import { memberships, shops, users } from '../server/db/schema';
import { hashPassword } from '../server/auth/passwords';

/** The demo accounts' shared password: demo mode only (see server/config.ts). */
export const DEMO_PASSWORD = 'wirewalk-demo';

export interface ShopSpec {
  name: string;
  people: { role: Role; name: string; email: string }[];
}

export interface SeededUser {
  id: string;
  email: string;
  name: string;
  role: Role;
}

export interface SeededShop {
  shopId: string;
  name: string;
  /** The first person of each role. */
  users: Record<Role, SeededUser>;
  people: SeededUser[];
}

/** The invented demo shop and its four accounts (DEVELOPERS.md lists them). */
export const demoShop: ShopSpec = {
  name: 'Tamarack Valley Equipment Repair',
  people: [
    { role: 'owner', name: 'Dana Whitfield', email: 'owner@example.com' },
    { role: 'lead', name: 'Marco Ruiz', email: 'lead@example.com' },
    { role: 'tech', name: 'Priya Okafor', email: 'tech@example.com' },
    { role: 'writer', name: 'Sam Lindqvist', email: 'writer@example.com' },
  ],
};

/** One shop with its people, all with `password`, in one transaction. */
export async function seedShop(deps: Pick<AppDeps, 'db' | 'config'>, spec: ShopSpec, password = DEMO_PASSWORD): Promise<SeededShop> {
  const shopId = newId();
  const hashes = await Promise.all(spec.people.map(() => hashPassword(deps.config, password)));
  const people: SeededUser[] = spec.people.map((p) => ({ id: newId(), email: p.email.toLowerCase(), name: p.name, role: p.role }));
  await deps.db.transaction(async (tx) => {
    await tx.insert(shops).values({ id: shopId, name: spec.name });
    await tx.insert(users).values(people.map((p, i) => ({ id: p.id, email: p.email, name: p.name, passwordHash: hashes[i] })));
    await tx.insert(memberships).values(people.map((p) => ({ id: newId(), shopId, userId: p.id, role: p.role })));
  });
  const byRole = {} as Record<Role, SeededUser>;
  for (const p of people) byRole[p.role] ??= p;
  return { shopId, name: spec.name, users: byRole, people };
}
