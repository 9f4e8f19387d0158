import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useNavigate, useParams } from 'react-router';
import { z } from 'zod';
import { invitationAcceptSchema, roleLabels } from '@shared/api/auth';
import { applyServerErrors, isApiError } from '@/lib/api';
import { Button, ButtonLink } from '@/components/Button';
import { TextField } from '@/components/fields';
import { FormError } from '@/components/FormError';
import { Loading } from '@/components/ProgressBar';
import { useAcceptInvitation, useInvitation } from './api';

const acceptFormSchema = invitationAcceptSchema
  .extend({ repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords are not the same' });

type Input = z.input<typeof acceptFormSchema>;
type Output = z.output<typeof acceptFormSchema>;

function DeadInvitation({ gone }: { gone: boolean }) {
  return (
    <>
      <h1 className="mb-2 text-2xl font-bold">{gone ? 'This invitation has run out' : 'This invitation link does not work'}</h1>
      <p className="mb-5">
        {gone
          ? 'Invitations work for a limited time and only once. Ask the shop owner to send you a new one.'
          : 'It may have been revoked, already used, or copied only in part. Ask the shop owner to send you a new one.'}
      </p>
      <ButtonLink to="/sign-in" className="w-full">
        Go to sign in
      </ButtonLink>
    </>
  );
}

export function Component() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation(token);
  const [formError, setFormError] = useState<unknown>(null);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(acceptFormSchema),
    defaultValues: { name: '', password: '', repeat: '' },
  });

  if (invitation.isPending) return <Loading label="Opening the invitation" />;
  if (invitation.error) {
    if (isApiError(invitation.error, 404)) return <DeadInvitation gone={false} />;
    if (isApiError(invitation.error, 410)) return <DeadInvitation gone />;
    return <FormError error={invitation.error} title="Wirewalk could not open this invitation." />;
  }
  const inv = invitation.data;

  const onSubmit = form.handleSubmit((values) => {
    setFormError(null);
    accept.mutate(
      { name: values.name, password: values.password },
      {
        onSuccess: () => navigate('/', { replace: true }),
        onError: (error) => {
          if (isApiError(error, 404) || isApiError(error, 410)) {
            setFormError('This invitation was revoked or has run out while you were filling in the form. Ask the shop owner for a new one.');
            return;
          }
          const rest = applyServerErrors(error, form.setError, ['name', 'password']);
          setFormError(rest.length ? rest : null);
        },
      },
    );
  });

  return (
    <>
      <title>Join the shop · Wirewalk</title>
      <h1 className="mb-1 text-2xl font-bold">Join {inv.shopName}</h1>
      <p className="mb-5">
        {inv.invitedBy} invited you to join as <strong>{roleLabels[inv.role].toLowerCase()}</strong>. Give your name and choose a
        password to sign in with.
      </p>
      <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        <FormError error={formError} />
        <div className="flex flex-col gap-1">
          <span className="font-medium">E-mail</span>
          <span className="break-all">{inv.email}</span>
        </div>
        <TextField control={form.control} name="name" label="Your name" autoComplete="name" hint="As the shop calls you; others see it on repair orders." autoFocus />
        <TextField control={form.control} name="password" label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." />
        <TextField control={form.control} name="repeat" label="Password again" type="password" autoComplete="new-password" />
        <Button type="submit" tone="primary" busy={accept.isPending} className="w-full">
          Join the shop
        </Button>
      </form>
    </>
  );
}
