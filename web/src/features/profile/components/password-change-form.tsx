import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/forms/field';
import { NewPasswordFields } from '../../../components/forms/new-password-fields';
import { fieldErrors } from '../../../lib/field-errors';
import { MIN_PASSWORD_LENGTH } from '../../../lib/password-strength';
import { useChangeOwnPassword } from '../api/password';

/**
 * Your own password: the current one, the new one twice. Saving signs you out everywhere else
 * (this browser stays signed in).
 */
export function PasswordChangeForm() {
  const change = useChangeOwnPassword();
  const [current, setCurrent] = useState('');
  const [next, setNext] = useState('');
  const [repeat, setRepeat] = useState('');
  const [mismatch, setMismatch] = useState(false);
  const errors = fieldErrors(change.error, ['currentPassword', 'newPassword'] as const);
  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    if (next !== repeat) return setMismatch(true);
    setMismatch(false);
    change.mutate(
      { currentPassword: current, newPassword: next },
      {
        onSuccess: () => {
          setCurrent('');
          setNext('');
          setRepeat('');
        },
      },
    );
  };
  const ended = change.data?.endedSessions ?? 0;
  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-md gap-3" aria-label="Change your password">
      <Field label="Current password" type="password" autoComplete="current-password" value={current} onChange={(e) => setCurrent(e.target.value)} error={errors.currentPassword} />
      <NewPasswordFields
        next={next}
        onNext={setNext}
        repeat={repeat}
        onRepeat={(value) => {
          setRepeat(value);
          setMismatch(false);
        }}
        mismatch={mismatch}
        error={errors.newPassword}
      />
      {errors.form && (
        <p role="alert" className="text-sm text-short dark:text-short-bright">
          Not changed: {errors.form}
        </p>
      )}
      <p role="status" aria-live="polite" className="min-h-5 text-sm">
        {change.isSuccess
          ? `Password changed. ${ended === 0 ? 'You were signed in nowhere else.' : `${ended} other ${ended === 1 ? 'session was' : 'sessions were'} signed out.`}`
          : null}
      </p>
      <div>
        <Button type="submit" disabled={change.isPending || !current || [...next].length < MIN_PASSWORD_LENGTH || !repeat}>
          {change.isPending ? 'Changing…' : 'Change password'}
        </Button>
      </div>
    </form>
  );
}
