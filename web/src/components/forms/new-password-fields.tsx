import { Field } from './field';
import { PasswordHint } from './password-hint';
import { PASSWORD_RULE } from '../../lib/password-strength';

/**
 * A new password typed twice, with the live strength hint and the rule under the first field and
 * the mismatch said by the second (the profile's password change and the reset-link page).
 */
export function NewPasswordFields({
  next,
  onNext,
  repeat,
  onRepeat,
  mismatch,
  error,
}: {
  next: string;
  onNext: (value: string) => void;
  repeat: string;
  /** Called with the second field's value; the caller clears its mismatch flag here. */
  onRepeat: (value: string) => void;
  mismatch: boolean;
  /** The server's or the form's message for the new password, if any. */
  error?: string;
}) {
  return (
    <>
      <Field
        label="New password"
        type="password"
        autoComplete="new-password"
        value={next}
        onChange={(e) => onNext(e.target.value)}
        error={error}
        hint={
          <>
            <PasswordHint password={next} />
            <span className="mt-1 block">{PASSWORD_RULE}</span>
          </>
        }
      />
      <Field
        label="New password again"
        type="password"
        autoComplete="new-password"
        value={repeat}
        onChange={(e) => onRepeat(e.target.value)}
        error={mismatch ? 'does not match the new password' : undefined}
      />
    </>
  );
}
