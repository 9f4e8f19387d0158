import { Link } from 'react-router';
import { roleLabels, type Role } from '@/lib/roles';
import { useMe, useMeta } from '@/lib/me';
import { PageHeader } from '@/components/PageHeader';
import { Card } from '@/components/Panel';
import { navigationFor } from '../navigation';

/** What each role comes to Wirewalk for (product.md), in the person's own terms. */
const roleWork: Record<Role, string> = {
  owner: 'You run the shop account: invite people, set their roles, and see every harness and repair order.',
  lead: 'You document harnesses from the service manual, a meter and the harness itself, and publish them when they are right.',
  tech: 'At the machine you open a connector, see what each cavity should read, follow a circuit, and record the readings you take.',
  writer: 'At the front desk you open repair orders for a customer’s unit, assign a tech, and send the finished report.',
};

function greeting(name: string) {
  const first = name.trim().split(/\s+/)[0];
  return first ? `Hello, ${first}` : 'Hello';
}

export function Component() {
  const { me } = useMe();
  const { meta } = useMeta();
  if (!me) return null;
  const entries = navigationFor(me.role, meta).filter((e) => e.to !== '/');
  return (
    <>
      <PageHeader title={greeting(me.user.name)} documentTitle="Home" lead={`${roleLabels[me.role]} at ${me.shop.name}. ${roleWork[me.role]}`} />
      <h2 className="mb-3 text-lg font-bold">Open to you now</h2>
      <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
        {entries.map((entry) => (
          <li key={entry.to}>
            <Card className="h-full">
              <Link to={entry.to} className="inline-flex min-h-11 items-center text-lg font-bold">
                {entry.label}
              </Link>
              {entry.description ? <p className="text-ink-muted">{entry.description}</p> : null}
            </Card>
          </li>
        ))}
      </ul>
    </>
  );
}
