import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router';
import type { z } from 'zod';
import { signInSchema } from '@shared/api/auth';
import { applyServerErrors, isApiError } from '@/lib/api';
import { useMe } from '@/lib/me';
import { Button } from '@/components/Button';
import { TextField } from '@/components/fields';
import { FormError } from '@/components/FormError';
import { safeNext } from '@/lib/paths';
import { useSignIn } from './api';

type Input = z.input<typeof signInSchema>;
type Output = z.output<typeof signInSchema>;

/** What a failed sign-in means, in words, and what to do next. */
export function signInErrorText(error: unknown): string | null {
  if (!error) return null;
  if (isApiError(error, 401)) {
    return 'That e-mail and password do not match an account here. Check both and try again, or set a new password.';
  }
  if (isApiError(error, 429)) {
    return 'Too many sign-in attempts in a short time. Wait a few minutes, then try again.';
  }
  return null;
}

export function Component() {
  const { me } = useMe();
  const [params] = useSearchParams();
  const next = safeNext(params.get('next'));
  const navigate = useNavigate();
  const signIn = useSignIn();
  const [formError, setFormError] = useState<unknown>(null);
  const form = useForm<Input, unknown, Output>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  if (me && !signIn.isPending && !signIn.isSuccess) return <Navigate to={next} replace />;

  const onSubmit = form.handleSubmit((values) => {
    setFormError(null);
    signIn.mutate(values, {
      onSuccess: () => navigate(next, { replace: true }),
      onError: (error) => {
        const text = signInErrorText(error);
        if (text) {
          setFormError(text);
          form.setValue('password', '');
          form.setFocus('password');
        } else {
          const rest = applyServerErrors(error, form.setError, ['email', 'password']);
          setFormError(rest.length ? rest : null);
        }
      },
    });
  });

  return (
    <>
      <title>Sign in · Wirewalk</title>
      <h1 className="mb-1 text-2xl font-bold">Sign in</h1>
      <p className="mb-5 text-ink-muted">With the e-mail address your shop invited.</p>
      <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        <FormError error={formError} />
        <TextField control={form.control} name="email" label="E-mail" type="email" autoComplete="username" inputMode="email" autoFocus />
        <TextField control={form.control} name="password" label="Password" type="password" autoComplete="current-password" />
        <Button type="submit" tone="primary" busy={signIn.isPending} className="w-full">
          Sign in
        </Button>
      </form>
      <p className="mt-5">
        <Link to="/forgot-password" className="inline-flex min-h-11 items-center">
          Forgot your password?
        </Link>
      </p>
    </>
  );
}
