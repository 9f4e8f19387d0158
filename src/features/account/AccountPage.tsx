import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { accountUpdateSchema, passwordChangeSchema, roleLabels } from '@shared/api/auth';
import { applyServerErrors, isApiError } from '@/lib/api';
import { Button } from '@/components/Button';
import { TextField } from '@/components/fields';
import { FormError } from '@/components/FormError';
import { PageHeader } from '@/components/PageHeader';
import { Panel } from '@/components/Panel';
import { Loading } from '@/components/ProgressBar';
import { ModeSwitch } from '@/components/ModeSwitch';
import { useToast } from '@/components/Toast';
import { useAccount, useChangePassword, useUpdateAccount, type Account } from './api';

type NameInput = z.input<typeof accountUpdateSchema>;
type NameOutput = z.output<typeof accountUpdateSchema>;

function NameForm({ account }: { account: Account }) {
  const update = useUpdateAccount();
  const { notify } = useToast();
  const [formError, setFormError] = useState<unknown>(null);
  const form = useForm<NameInput, unknown, NameOutput>({ resolver: zodResolver(accountUpdateSchema), defaultValues: { name: account.name } });
  const { reset } = form;
  useEffect(() => reset({ name: account.name }), [account.name, reset]);

  const onSubmit = form.handleSubmit((values) => {
    setFormError(null);
    update.mutate(values, {
      onSuccess: () => notify('Name saved.'),
      onError: (error) => {
        const rest = applyServerErrors(error, form.setError, ['name']);
        setFormError(rest.length ? rest : null);
      },
    });
  });

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormError error={formError} />
      <TextField control={form.control} name="name" label="Name" autoComplete="name" hint="Others see it on repair orders and readings." />
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        <dt className="text-ink-muted">E-mail</dt>
        <dd className="break-all">{account.email}</dd>
        <dt className="text-ink-muted">Role</dt>
        <dd>{roleLabels[account.role]}</dd>
        <dt className="text-ink-muted">Shop</dt>
        <dd>{account.shopName}</dd>
      </dl>
      <div>
        <Button type="submit" tone="primary" busy={update.isPending} disabled={!form.formState.isDirty}>
          Save name
        </Button>
      </div>
    </form>
  );
}

const passwordFormSchema = passwordChangeSchema
  .extend({ currentPassword: z.string().min(1, 'Enter your current password').max(200), repeat: z.string() })
  .refine((v) => v.newPassword === v.repeat, { path: ['repeat'], message: 'The two new passwords are not the same' });
type PasswordInput = z.input<typeof passwordFormSchema>;
type PasswordOutput = z.output<typeof passwordFormSchema>;

function PasswordForm() {
  const change = useChangePassword();
  const { notify } = useToast();
  const [formError, setFormError] = useState<unknown>(null);
  const form = useForm<PasswordInput, unknown, PasswordOutput>({
    resolver: zodResolver(passwordFormSchema),
    defaultValues: { currentPassword: '', newPassword: '', repeat: '' },
  });

  const onSubmit = form.handleSubmit((values) => {
    setFormError(null);
    change.mutate(
      { currentPassword: values.currentPassword, newPassword: values.newPassword },
      {
        onSuccess: () => {
          form.reset();
          notify('Password changed. Use the new one from now on.');
        },
        onError: (error) => {
          if ((isApiError(error, 400) || isApiError(error, 401) || isApiError(error, 403)) && error.details.length === 0) {
            form.setError('currentPassword', { type: 'server', message: 'This is not your current password' }, { shouldFocus: true });
            return;
          }
          const rest = applyServerErrors(error, form.setError, ['currentPassword', 'newPassword']);
          setFormError(rest.length ? rest : null);
        },
      },
    );
  });

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormError error={formError} />
      <TextField control={form.control} name="currentPassword" label="Current password" type="password" autoComplete="current-password" />
      <TextField control={form.control} name="newPassword" label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." />
      <TextField control={form.control} name="repeat" label="New password again" type="password" autoComplete="new-password" />
      <div>
        <Button type="submit" tone="primary" busy={change.isPending}>
          Change password
        </Button>
      </div>
    </form>
  );
}

export function Component() {
  const account = useAccount();
  return (
    <>
      <PageHeader title="Account" lead="Your name, your password, and how Wirewalk looks on this device." />
      <div className="grid max-w-5xl gap-4 lg:grid-cols-2">
        <Panel title="You">
          {account.data ? <NameForm account={account.data} /> : account.error ? <FormError error={account.error} /> : <Loading label="Loading your account" />}
        </Panel>
        <Panel title="Password">
          <PasswordForm />
        </Panel>
        <Panel title="Display" description="Kept on this device.">
          <ModeSwitch />
          <p className="mt-3 text-ink-muted">Bench mode for the office and printing; bay mode for a dark engine bay.</p>
        </Panel>
      </div>
    </>
  );
}
