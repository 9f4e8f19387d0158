import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useParams } from 'react-router';
import { z } from 'zod';
import { newPasswordSchema } from '@shared/api/auth';
import { applyServerErrors, isApiError } from '@/lib/api';
import { Button, ButtonLink } from '@/components/Button';
import { TextField } from '@/components/fields';
import { FormError } from '@/components/FormError';
import { useConfirmPasswordReset } from './api';

const resetFormSchema = z
  .object({ password: newPasswordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords are not the same' });

type Input = z.input<typeof resetFormSchema>;
type Output = z.output<typeof resetFormSchema>;

export function Component() {
  const { token = '' } = useParams();
  const confirm = useConfirmPasswordReset();
  const [formError, setFormError] = useState<unknown>(null);
  const form = useForm<Input, unknown, Output>({ resolver: zodResolver(resetFormSchema), defaultValues: { password: '', repeat: '' } });

  if (confirm.isSuccess) {
    return (
      <>
        <h1 className="mb-2 text-2xl font-bold">
          <span aria-hidden="true" className="text-ok">
            ✓{' '}
          </span>
          Password changed
        </h1>
        <p className="mb-5">Sign in with your e-mail and the new password.</p>
        <ButtonLink to="/sign-in" tone="primary" className="w-full">
          Sign in
        </ButtonLink>
      </>
    );
  }

  const tokenDead = isApiError(confirm.error, 400) && confirm.error.code === 'invalid_token';

  const onSubmit = form.handleSubmit((values) => {
    setFormError(null);
    confirm.mutate(
      { token, password: values.password },
      {
        onError: (error) => {
          if (isApiError(error, 400) && error.code === 'invalid_token') return;
          const rest = applyServerErrors(error, form.setError, ['password']);
          setFormError(rest.length ? rest : null);
        },
      },
    );
  });

  if (tokenDead) {
    return (
      <>
        <h1 className="mb-2 text-2xl font-bold">This link no longer works</h1>
        <p className="mb-5">
          A password link works once and for a limited time; this one was used already or has run out. Ask for a new one.
        </p>
        <ButtonLink to="/forgot-password" tone="primary" className="w-full">
          Ask for a new link
        </ButtonLink>
      </>
    );
  }

  return (
    <>
      <title>Choose a new password · Wirewalk</title>
      <h1 className="mb-1 text-2xl font-bold">Choose a new password</h1>
      <p className="mb-5 text-ink-muted">At least 10 characters. A few unrelated words make a good one.</p>
      <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        <FormError error={formError} />
        <TextField control={form.control} name="password" label="New password" type="password" autoComplete="new-password" autoFocus />
        <TextField control={form.control} name="repeat" label="New password again" type="password" autoComplete="new-password" />
        <Button type="submit" tone="primary" busy={confirm.isPending} className="w-full">
          Save the new password
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
