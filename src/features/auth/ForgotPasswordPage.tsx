import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router';
import type { z } from 'zod';
import { passwordResetRequestSchema } from '@shared/api/auth';
import { applyServerErrors, isApiError } from '@/lib/api';
import { Button } from '@/components/Button';
import { TextField } from '@/components/fields';
import { FormError } from '@/components/FormError';
import { useRequestPasswordReset } from './api';

type Input = z.input<typeof passwordResetRequestSchema>;
type Output = z.output<typeof passwordResetRequestSchema>;

export function Component() {
  const request = useRequestPasswordReset();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [formError, setFormError] = useState<unknown>(null);
  const form = useForm<Input, unknown, Output>({ resolver: zodResolver(passwordResetRequestSchema), defaultValues: { email: '' } });

  const onSubmit = form.handleSubmit((values) => {
    setFormError(null);
    request.mutate(values, {
      onSuccess: () => setSentTo(values.email),
      onError: (error) => {
        if (isApiError(error, 429)) setFormError('Too many requests in a short time. Wait a few minutes, then ask again.');
        else {
          const rest = applyServerErrors(error, form.setError, ['email']);
          setFormError(rest.length ? rest : null);
        }
      },
    });
  });

  if (sentTo) {
    return (
      <>
        <h1 className="mb-2 text-2xl font-bold">Check your e-mail</h1>
        <p>
          If <strong className="break-all">{sentTo}</strong> has a Wirewalk account, a link to set a new password is on its
          way. The link works once and for a limited time.
        </p>
        <p className="mt-3 text-ink-muted">Nothing after a few minutes? Look in the spam folder, or ask your shop owner.</p>
        <p className="mt-5">
          <Link to="/sign-in" className="inline-flex min-h-11 items-center">
            Back to sign in
          </Link>
        </p>
      </>
    );
  }

  return (
    <>
      <title>New password · Wirewalk</title>
      <h1 className="mb-1 text-2xl font-bold">Set a new password</h1>
      <p className="mb-5 text-ink-muted">Give the e-mail you sign in with; Wirewalk sends a link to set a new password.</p>
      <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        <FormError error={formError} />
        <TextField control={form.control} name="email" label="E-mail" type="email" autoComplete="email" inputMode="email" autoFocus />
        <Button type="submit" tone="primary" busy={request.isPending} className="w-full">
          Send the link
        </Button>
      </form>
      <p className="mt-5">
        <Link to="/sign-in" className="inline-flex min-h-11 items-center">
          Back to sign in
        </Link>
      </p>
    </>
  );
}
