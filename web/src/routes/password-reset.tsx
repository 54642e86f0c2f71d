import { useState, type FormEvent } from 'react';
import { Link, useLocation } from 'react-router-dom';
import { Button } from '../components/ui/button';
import { paths } from '../config/paths';
import { NewPasswordFields } from '../components/forms/new-password-fields';
import { fieldErrors } from '../lib/field-errors';
import { MIN_PASSWORD_LENGTH } from '../lib/password-strength';
import { completePasswordReset } from '../features/profile/api/password';
import { ApiError } from '../lib/api';

/**
 * Setting a new password from a one-time link an administrator had mailed: the token is the
 * link's fragment (`/password-reset#…`), so it never appears in a request line or a server log.
 * Public: the person is signed out (using the link signs them out everywhere).
 */
export function Component() {
  const token = useLocation().hash.replace(/^#/, '');
  const [next, setNext] = useState('');
  const [repeat, setRepeat] = useState('');
  const [mismatch, setMismatch] = useState(false);
  const [error, setError] = useState<unknown>(null);
  const [busy, setBusy] = useState(false);
  const [doneFor, setDoneFor] = useState<string | null>(null);
  const errors = fieldErrors(error, ['newPassword'] as const);
  const linkDead = error instanceof ApiError && error.code === 'reset-link-invalid';
  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    if (next !== repeat) return setMismatch(true);
    setMismatch(false);
    setBusy(true);
    setError(null);
    try {
      setDoneFor((await completePasswordReset({ token, newPassword: next })).email);
    } catch (e) {
      setError(e);
    } finally {
      setBusy(false);
    }
  };
  return (
    <main className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-2 text-2xl font-medium tracking-tight text-fern dark:text-fern-bright">
          <img src="/longtail.svg" alt="" className="h-8 w-8" />
          longtail
        </div>
        <h1 className="text-lg font-medium">Set a new password</h1>
        {doneFor ? (
          <div role="status" className="mt-3 space-y-3 rounded-lg border border-rule bg-sheet p-4 text-sm dark:border-night-rule dark:bg-night-sheet">
            <p>
              <span aria-hidden="true">✓ </span>
              The password of {doneFor} is set. Every earlier session of the account was signed out, and the link is used up.
            </p>
            <Link to={paths.signIn.href()} className="font-medium text-fern underline dark:text-fern-bright">
              Sign in with the new password
            </Link>
          </div>
        ) : token === '' ? (
          <p role="alert" className="mt-3 text-sm text-short dark:text-short-bright">
            This page needs the whole link from the e-mail (the part after # holds the one-time code). Open the link from the message again, or ask an administrator for a new one.
          </p>
        ) : (
          <>
            <p className="mb-4 text-sm text-ink-soft dark:text-night-ink-soft">The link works once. Setting the password signs the account out everywhere.</p>
            <form onSubmit={onSubmit} noValidate className="space-y-3 rounded-lg border border-rule bg-sheet p-4 dark:border-night-rule dark:bg-night-sheet">
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
              {(linkDead || errors.form) && (
                <p role="alert" className="text-sm text-short dark:text-short-bright">
                  {linkDead ? (error as ApiError).message : `Not set: ${errors.form}`}
                </p>
              )}
              <Button type="submit" className="w-full" disabled={busy || [...next].length < MIN_PASSWORD_LENGTH || !repeat}>
                {busy ? 'Setting…' : 'Set the new password'}
              </Button>
            </form>
          </>
        )}
      </div>
    </main>
  );
}
