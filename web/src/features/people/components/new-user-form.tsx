import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { ACCOUNT_ROLES, ACCOUNT_ROLE_TITLES, type AccountRole } from '#shared/workflow/roles';
import { Button } from '../../../components/ui/button';
import { Sheet } from '../../../components/ui/sheet';
import { useCreateUser } from '../api/user-mutations';
import type { NewUser } from '../api/user-queries';
import { fieldErrors, type FieldErrors } from '../../../lib/field-errors';
import { MIN_PASSWORD_LENGTH, PASSWORD_RULE } from '../../../lib/password-strength';
import { Field } from '../../../components/forms/field';
import { PasswordHint } from '../../../components/forms/password-hint';

const FIELDS = ['email', 'displayName', 'role', 'password'] as const;
type FieldName = (typeof FIELDS)[number];

const EMPTY: NewUser = { email: '', displayName: '', role: 'member', password: '' };

/** The checks people expect before anything is sent; the server checks again and has the last word. */
function localErrors(user: NewUser): FieldErrors<FieldName> {
  const errors: FieldErrors<FieldName> = {};
  if (!/^[^@\s]+@[^@\s]+$/.test(user.email.trim())) errors.email = 'must be an e-mail address, like name@example.com';
  if (!user.displayName.trim()) errors.displayName = 'is required';
  if ([...user.password].length < MIN_PASSWORD_LENGTH) errors.password = `must be at least ${MIN_PASSWORD_LENGTH} characters`;
  return errors;
}

/** A new account: e-mail, name, role and a first password the person should change. */
export function NewUserForm() {
  const roleId = useId();
  const formRef = useRef<HTMLFormElement>(null);
  const [user, setUser] = useState<NewUser>(EMPTY);
  const [errors, setErrors] = useState<FieldErrors<FieldName>>({});
  const [refused, setRefused] = useState(0);
  const [created, setCreated] = useState<string | null>(null);
  const create = useCreateUser();
  // After a refused submit, take the keyboard to the first field that needs fixing.
  useEffect(() => {
    if (refused > 0) formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }, [refused]);
  const refuse = (next: FieldErrors<FieldName>) => {
    setErrors(next);
    setRefused((n) => n + 1);
  };
  const set = (field: FieldName, value: string) => {
    setUser((u) => ({ ...u, [field]: value }));
    setErrors(({ [field]: _fixed, form: _form, ...rest }) => rest);
  };
  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    setCreated(null);
    const local = localErrors(user);
    if (Object.keys(local).length > 0) return refuse(local);
    setErrors({});
    create.mutate(
      { ...user, email: user.email.trim(), displayName: user.displayName.trim() },
      {
        onSuccess: (account) => {
          setUser(EMPTY);
          setCreated(`${account.displayName} (${ACCOUNT_ROLE_TITLES[account.role]}) can now sign in as ${account.email}.`);
        },
        onError: (error) => refuse(fieldErrors(error, FIELDS)),
      },
    );
  };
  return (
    <Sheet title="New account" aria-label="New account">
      <form ref={formRef} noValidate onSubmit={onSubmit} className="space-y-3">
        <Field label="E-mail" type="email" autoComplete="off" value={user.email} onChange={(e) => set('email', e.target.value)} error={errors.email} />
        <Field label="Display name" autoComplete="off" value={user.displayName} maxLength={120} onChange={(e) => set('displayName', e.target.value)} error={errors.displayName} />
        <div className="text-sm">
          <label htmlFor={roleId} className="mb-1 block font-medium">
            Account
          </label>
          <select
            id={roleId}
            value={user.role}
            onChange={(e) => set('role', e.target.value as AccountRole)}
            className="w-full rounded-md border border-rule bg-sheet px-2 py-1.5 dark:border-night-rule dark:bg-night"
          >
            {ACCOUNT_ROLES.map((role) => (
              <option key={role} value={role}>
                {ACCOUNT_ROLE_TITLES[role]}
              </option>
            ))}
          </select>
          <p className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft">What a member does (systems engineer, designer, reviewer) is set per project, when you add them to one.</p>
          {errors.role && <p className="mt-1 text-xs text-short dark:text-short-bright">{errors.role}</p>}
        </div>
        <Field
          label="First password"
          type="password"
          autoComplete="new-password"
          value={user.password}
          onChange={(e) => set('password', e.target.value)}
          error={errors.password}
          hint={
            <>
              <PasswordHint password={user.password} />
              <span className="mt-1 block">{PASSWORD_RULE}</span>
            </>
          }
        />
        {errors.form && (
          <p role="alert" className="text-sm text-short dark:text-short-bright">
            {errors.form}
          </p>
        )}
        <Button type="submit" disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create account'}
        </Button>
        <p role="status" className="text-sm text-holds dark:text-holds-bright">
          {created && (
            <>
              <span aria-hidden="true">✓ </span>
              {created} Add them to projects below.
            </>
          )}
        </p>
      </form>
    </Sheet>
  );
}
