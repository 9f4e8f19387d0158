import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { useForm } from 'react-hook-form';
import { act } from 'react';
import { ReadingBadge, readingText, isInRange } from '@/components/ReadingBadge';
import { WireSwatch, swatchPaint } from '@/components/WireSwatch';
import { Caution } from '@/components/Caution';
import { cautions } from '@/components/cautions';
import { CheckboxField, TextAreaField, TextField } from '@/components/fields';
import { ConfirmDialog } from '@/components/ConfirmDialog';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { ApiError, applyServerErrors, fieldPath } from '@/lib/api';
import { safeNext } from '@/lib/paths';
import * as shellRoles from '@/lib/roles';
import * as sharedAuth from '@shared/api/auth';

describe('ReadingBadge', () => {
  it('says OUT with a cross and the expected range', () => {
    render(<ReadingBadge value={0} expected={{ min: 12.4, max: 12.8 }} unit="V" />);
    expect(screen.getByText('OUT: 0.0 V, expected 12.4–12.8 V')).toBeInTheDocument();
    expect(screen.getByText('✗')).toBeInTheDocument();
  });
  it('says IN with a tick; bounds count as in range; open line reads OL', () => {
    render(<ReadingBadge value={12.4} expected={{ min: 12.4, max: 12.8 }} unit="V" />);
    expect(screen.getByText('IN: 12.4 V, expected 12.4–12.8 V')).toBeInTheDocument();
    expect(screen.getByText('✓')).toBeInTheDocument();
    expect(readingText(Infinity, { min: 55, max: 65 }, 'Ω', 0)).toBe('OUT: OL Ω, expected 55–65 Ω');
    expect(isInRange(Number.NaN, { min: 0, max: 1 })).toBe(false);
  });
});

describe('WireSwatch', () => {
  it('shows the code beside the colour and names it for screen readers', () => {
    render(<WireSwatch colour="rd/wh" />);
    expect(screen.getByText('RD/WH')).toBeInTheDocument();
    expect(screen.getByRole('img', { name: 'red with white stripe' })).toBeInTheDocument();
  });
  it('draws GNYE with its second colour as the stripe, and takes paint directly', () => {
    expect(swatchPaint('GNYE')).toMatchObject({ code: 'GNYE', base: '#2a9a3a', stripe: '#f2d21f' });
    render(<WireSwatch base="#000000" code="XX" name="custom" />);
    expect(screen.getByText('XX')).toBeInTheDocument();
  });
  it('marks text that is not a colour as unknown', () => {
    render(<WireSwatch colour="purple-ish" />);
    expect(screen.getByRole('img', { name: 'unknown colour purple-ish' })).toBeInTheDocument();
  });
});

describe('Caution', () => {
  it('renders a caution from the one module by id', () => {
    render(<Caution id="disconnectBattery" />);
    expect(screen.getByRole('note', { name: `Caution: ${cautions.disconnectBattery.title}` })).toHaveTextContent(cautions.disconnectBattery.text);
  });
});

describe('server errors onto form fields', () => {
  it('maps JSON paths to field paths', () => {
    expect(fieldPath('$.email')).toBe('email');
    expect(fieldPath('$.items[2].name')).toBe('items.2.name');
    expect(fieldPath('email')).toBe('email');
  });

  it('puts details on fields and answers the rest', async () => {
    let form: ReturnType<typeof useForm<{ email: string }>> | null = null;
    function F() {
      const f = useForm<{ email: string }>({ defaultValues: { email: '' } });
      form = f;
      return <TextField control={f.control} name="email" label="E-mail" />;
    }
    render(<F />);
    const error = new ApiError(400, 'invalid_request', 'Bad', [
      { path: '$.email', message: 'Not an address' },
      { path: '$.other', message: 'Something else' },
    ]);
    let rest: string[] = [];
    await act(async () => {
      rest = applyServerErrors(error, form!.setError, ['email']);
    });
    expect(screen.getByText('Not an address')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true');
    expect(rest).toEqual(['other: Something else']);
    expect(applyServerErrors(new ApiError(409, 'x', 'Already there'), form!.setError, ['email'])).toEqual(['Already there']);
  });
});

describe('return path after sign-in', () => {
  it('only goes to paths on this site', () => {
    expect(safeNext('/people')).toBe('/people');
    expect(safeNext('//evil.example')).toBe('/');
    expect(safeNext('https://evil.example')).toBe('/');
    expect(safeNext('/\\evil.example')).toBe('/');
    expect(safeNext(null)).toBe('/');
  });
});

describe('more fields', () => {
  it('binds a text area and a checkbox to the form', async () => {
    let values: { notes: string; done: boolean } | null = null;
    function F() {
      const f = useForm<{ notes: string; done: boolean }>({ defaultValues: { notes: '', done: false } });
      return (
        <form onSubmit={f.handleSubmit((v) => (values = v))}>
          <TextAreaField control={f.control} name="notes" label="Complaint" />
          <CheckboxField control={f.control} name="done" label="Recalibrated the throttle" />
          <button type="submit">Save</button>
        </form>
      );
    }
    render(<F />);
    const user = userEvent.setup();
    await user.type(screen.getByLabelText('Complaint'), 'No crank');
    await user.click(screen.getByLabelText('Recalibrated the throttle'));
    await user.click(screen.getByRole('button', { name: 'Save' }));
    expect(values).toEqual({ notes: 'No crank', done: true });
  });
});

describe('ConfirmDialog', () => {
  it('puts focus on Cancel and closes on Escape', async () => {
    function D() {
      const [open, setOpen] = useState(true);
      return (
        <ConfirmDialog open={open} title="Remove Ana?" confirmLabel="Remove Ana" onConfirm={() => {}} onCancel={() => setOpen(false)}>
          Ana will be signed out.
        </ConfirmDialog>
      );
    }
    render(<D />);
    expect(screen.getByRole('button', { name: 'Cancel' })).toHaveFocus();
    await userEvent.setup().keyboard('{Escape}');
    expect(screen.queryByRole('alertdialog')).not.toBeInTheDocument();
  });
});

describe('zod-free roles for the shell', () => {
  it('match the shared schema module', () => {
    expect([...shellRoles.roles]).toEqual([...sharedAuth.roles]);
    expect(shellRoles.roleLabels).toEqual(sharedAuth.roleLabels);
  });
});
