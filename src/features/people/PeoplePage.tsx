import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { invitationCreateSchema, roleLabels, roles, type Role } from '@shared/api/auth';
import { applyServerErrors, isApiError } from '@/lib/api';
import { formatDate } from '@/lib/format';
import { meQueryKey, useMe } from '@/lib/me';
import { Button } from '@/components/Button';
import { ConfirmDialog } from '@/components/ConfirmDialog';
import { EmptyState } from '@/components/EmptyState';
import { SelectField, TextField } from '@/components/fields';
import { FormError } from '@/components/FormError';
import { PageHeader } from '@/components/PageHeader';
import { Panel } from '@/components/Panel';
import { Loading } from '@/components/ProgressBar';
import { useToast } from '@/components/Toast';
import { useChangeRole, useInvite, usePeople, useRemovePerson, useRevokeInvitation, type PendingInvitation, type Person } from './api';

const roleOptions = roles.map((r) => ({ value: r, label: roleLabels[r] }));

/** What each role may do, shown beside the invitation form so the owner picks knowingly. */
const roleScope: Record<Role, string> = {
  owner: 'runs the account: people, roles, every harness and repair order',
  lead: 'documents and publishes harnesses',
  tech: 'reads pin cards, walks circuits, records readings',
  writer: 'opens repair orders and sends reports',
};

type InviteInput = z.input<typeof invitationCreateSchema>;
type InviteOutput = z.output<typeof invitationCreateSchema>;

function InviteForm() {
  const invite = useInvite();
  const { notify } = useToast();
  const [formError, setFormError] = useState<unknown>(null);
  const form = useForm<InviteInput, unknown, InviteOutput>({
    resolver: zodResolver(invitationCreateSchema),
    defaultValues: { email: '', role: 'tech' },
  });

  const onSubmit = form.handleSubmit((values) => {
    setFormError(null);
    invite.mutate(values, {
      onSuccess: () => {
        notify(`Invitation sent to ${values.email} as ${roleLabels[values.role].toLowerCase()}.`);
        form.reset({ email: '', role: values.role });
      },
      onError: (error) => {
        if (isApiError(error, 409)) {
          form.setError('email', { type: 'server', message: error.message }, { shouldFocus: true });
          return;
        }
        const rest = applyServerErrors(error, form.setError, ['email', 'role']);
        setFormError(rest.length ? rest : null);
      },
    });
  });

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4" aria-label="Invite someone">
      <FormError error={formError} />
      <div className="grid gap-4 sm:grid-cols-[1fr_14rem]">
        <TextField control={form.control} name="email" label="E-mail" type="email" inputMode="email" autoComplete="off" />
        <SelectField control={form.control} name="role" label="Role" options={roleOptions} />
      </div>
      <ul className="grid gap-x-6 text-sm text-ink-muted sm:grid-cols-2">
        {roles.map((r) => (
          <li key={r}>
            <strong className="text-ink">{roleLabels[r]}</strong>: {roleScope[r]}
          </li>
        ))}
      </ul>
      <div>
        <Button type="submit" tone="primary" busy={invite.isPending}>
          Send invitation
        </Button>
      </div>
    </form>
  );
}

function Invitations({ invitations }: { invitations: PendingInvitation[] }) {
  const revoke = useRevokeInvitation();
  const { notify } = useToast();
  const [target, setTarget] = useState<PendingInvitation | null>(null);

  if (invitations.length === 0) {
    return <p className="text-ink-muted">No invitations waiting. Invitations that are accepted, revoked or run out leave this list.</p>;
  }
  return (
    <>
      <ul className="divide-y divide-line">
        {invitations.map((inv) => (
          <li key={inv.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
            <div className="min-w-0">
              <p className="font-medium break-all">{inv.email}</p>
              <p className="text-sm text-ink-muted">
                {roleLabels[inv.role]} · sent {formatDate(inv.invitedAt)} · works until {formatDate(inv.expiresAt)}
              </p>
            </div>
            <Button onClick={() => setTarget(inv)} aria-label={`Revoke the invitation for ${inv.email}`}>
              Revoke
            </Button>
          </li>
        ))}
      </ul>
      <ConfirmDialog
        open={target !== null}
        title="Revoke this invitation?"
        confirmLabel="Revoke invitation"
        busy={revoke.isPending}
        error={revoke.error}
        onCancel={() => {
          setTarget(null);
          revoke.reset();
        }}
        onConfirm={() =>
          target &&
          revoke.mutate(target.id, {
            onSuccess: () => {
              notify(`Invitation for ${target.email} revoked. Its link no longer works.`);
              setTarget(null);
            },
          })
        }
      >
        The link sent to <strong className="break-all">{target?.email}</strong> will stop working. You can invite them again later.
      </ConfirmDialog>
    </>
  );
}

type PendingChange = { kind: 'role'; person: Person; role: Role } | { kind: 'remove'; person: Person };

function PeopleList({ people }: { people: Person[] }) {
  const { me } = useMe();
  const queryClient = useQueryClient();
  const changeRole = useChangeRole();
  const remove = useRemovePerson();
  const { notify } = useToast();
  const [pending, setPending] = useState<PendingChange | null>(null);
  const busy = changeRole.isPending || remove.isPending;
  const error = pending?.kind === 'role' ? changeRole.error : pending?.kind === 'remove' ? remove.error : null;

  const close = () => {
    setPending(null);
    changeRole.reset();
    remove.reset();
  };

  const confirm = () => {
    if (!pending) return;
    const { person } = pending;
    const isMe = person.userId === me?.user.id;
    if (pending.kind === 'role') {
      changeRole.mutate(
        { userId: person.userId, role: pending.role },
        {
          onSuccess: () => {
            notify(`${person.name} is now ${roleLabels[pending.role].toLowerCase()}.`);
            if (isMe) void queryClient.invalidateQueries({ queryKey: meQueryKey });
            setPending(null);
          },
        },
      );
    } else {
      remove.mutate(person.userId, {
        onSuccess: () => {
          notify(`${person.name} was removed from the shop.`);
          if (isMe) void queryClient.invalidateQueries({ queryKey: meQueryKey });
          setPending(null);
        },
      });
    }
  };

  const errorText = isApiError(error, 409)
    ? 'A shop needs at least one owner. Make someone else owner first.'
    : error;

  return (
    <>
      <ul className="divide-y divide-line">
        {people.map((person) => {
          const isMe = person.userId === me?.user.id;
          const selectId = `role-${person.userId}`;
          return (
            <li key={person.userId} className="grid grid-cols-[1fr_auto] items-center gap-3 py-3 sm:grid-cols-[1fr_14rem_auto]">
              <div className="col-span-2 min-w-0 sm:col-span-1">
                <p className="font-medium">
                  {person.name}
                  {isMe ? <span className="ml-2 text-sm text-ink-muted">(you)</span> : null}
                </p>
                <p className="text-sm text-ink-muted">
                  <span className="break-all">{person.email}</span> · joined {formatDate(person.joinedAt)}
                </p>
              </div>
              <div>
                <label htmlFor={selectId} className="sr-only">
                  Role of {person.name}
                </label>
                <select
                  id={selectId}
                  value={person.role}
                  disabled={busy}
                  onChange={(e) => setPending({ kind: 'role', person, role: e.target.value as Role })}
                  className="block min-h-11 w-full rounded-control border border-field bg-surface px-3 text-base text-ink"
                >
                  {roleOptions.map((o) => (
                    <option key={o.value} value={o.value}>
                      {o.label}
                    </option>
                  ))}
                </select>
              </div>
              <Button tone="danger" disabled={busy} onClick={() => setPending({ kind: 'remove', person })} aria-label={`Remove ${person.name}`}>
                Remove
              </Button>
            </li>
          );
        })}
      </ul>
      <ConfirmDialog
        open={pending !== null}
        title={
          pending?.kind === 'role'
            ? `Make ${pending.person.name} ${roleLabels[pending.role].toLowerCase()}?`
            : `Remove ${pending?.person.name} from the shop?`
        }
        confirmLabel={pending?.kind === 'role' ? 'Change role' : `Remove ${pending?.person.name ?? ''}`.trim()}
        tone={pending?.kind === 'role' ? 'primary' : 'danger'}
        busy={busy}
        error={errorText}
        onCancel={close}
        onConfirm={confirm}
      >
        {pending?.kind === 'role' ? (
          <p>
            {pending.person.name} will be able to: {roleScope[pending.role]}.
            {pending.person.userId === me?.user.id && pending.role !== 'owner'
              ? ' You are changing your own role: you will lose the owner pages, People included.'
              : ''}
          </p>
        ) : pending ? (
          <p>
            {pending.person.name} will be signed out and can no longer open this shop. Their readings and notes stay on the
            records. {pending.person.userId === me?.user.id ? 'You are removing yourself.' : ''}
          </p>
        ) : null}
      </ConfirmDialog>
    </>
  );
}

export function Component() {
  const people = usePeople();
  const { me } = useMe();
  return (
    <>
      <PageHeader title="People" lead={`Who works in ${me?.shop.name ?? 'the shop'}, and what each may do.`} />
      <div className="grid max-w-5xl gap-4">
        <Panel title="Invite someone" description="They get an e-mail with a link to choose a password and join.">
          <InviteForm />
        </Panel>
        {people.isPending ? (
          <Loading label="Loading people" />
        ) : people.error ? (
          <FormError error={people.error} title="Wirewalk could not load the people of the shop." />
        ) : (
          <>
            <Panel title={`Waiting invitations (${people.data.invitations.length})`}>
              <Invitations invitations={people.data.invitations} />
            </Panel>
            <Panel title={`People in the shop (${people.data.people.length})`}>
              {people.data.people.length ? (
                <PeopleList people={people.data.people} />
              ) : (
                <EmptyState title="Nobody here yet">Invite the first person above.</EmptyState>
              )}
            </Panel>
          </>
        )}
      </div>
    </>
  );
}
