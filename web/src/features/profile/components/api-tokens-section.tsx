import { useState, type FormEvent } from 'react';
import { Field } from '../../../components/forms/field';
import { Button } from '../../../components/ui/button';
import { When } from '../../../components/ui/when';
import { fieldErrors } from '../../../lib/field-errors';
import { useApiTokens, useCreateApiToken, useRevokeApiToken } from '../api/api-tokens';

/**
 * Your personal API tokens for scripts and CI: make one (named for what it is for; the token is
 * shown once, with a copy button), see when each was last used, revoke one. A token acts as you,
 * in your projects with your roles; its every use is in the audit trail.
 */
export function ApiTokensSection() {
  const tokens = useApiTokens();
  const create = useCreateApiToken();
  const revoke = useRevokeApiToken();
  const [name, setName] = useState('');
  const [copied, setCopied] = useState(false);
  const errors = fieldErrors(create.error, ['name'] as const);
  const made = create.data;

  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    setCopied(false);
    create.mutate({ name: name.trim() }, { onSuccess: () => setName('') });
  };
  const copy = async () => {
    if (!made) return;
    await navigator.clipboard.writeText(made.token);
    setCopied(true);
  };

  return (
    <div className="grid gap-4">
      <p className="text-sm text-ink-soft dark:text-night-ink-soft">
        A token lets a script act as you (<code>Authorization: Bearer …</code>): in your projects, with your roles, no sign-in. Keep it like a password; each use is recorded in the audit trail.
      </p>
      <form onSubmit={onSubmit} noValidate className="flex max-w-md flex-wrap items-end gap-3" aria-label="Make an API token">
        <div className="min-w-48 flex-1">
          <Field label="What it is for" value={name} maxLength={120} placeholder="CI on the bench rig" onChange={(e) => setName(e.target.value)} error={errors.name} />
        </div>
        <Button type="submit" disabled={create.isPending || name.trim() === ''}>
          {create.isPending ? 'Making…' : 'Make token'}
        </Button>
      </form>
      {errors.form && (
        <p role="alert" className="text-sm text-short dark:text-short-bright">
          Not made: {errors.form}
        </p>
      )}
      {made && (
        <div role="status" className="grid gap-2 rounded-md border border-fern/40 bg-fern-soft p-3 text-sm dark:border-night-rule dark:bg-night">
          <p className="font-medium">Token “{made.name}”: copy it now, it is not shown again.</p>
          <div className="flex flex-wrap items-center gap-2">
            <code aria-label="New token" className="min-w-0 flex-1 break-all rounded bg-sheet px-2 py-1 font-mono text-xs dark:bg-night-sheet">
              {made.token}
            </code>
            <Button variant="secondary" onClick={() => void copy()}>
              {copied ? 'Copied' : 'Copy'}
            </Button>
          </div>
        </div>
      )}
      {tokens.isError && (
        <p role="alert" className="text-sm text-short dark:text-short-bright">
          Your tokens could not be read: {tokens.error.message}
        </p>
      )}
      {tokens.data && tokens.data.length === 0 && <p className="text-sm text-ink-soft dark:text-night-ink-soft">No tokens yet.</p>}
      {tokens.data && tokens.data.length > 0 && (
        <ul className="divide-y divide-rule text-sm dark:divide-night-rule" aria-label="Your API tokens">
          {tokens.data.map((token) => (
            <li key={token.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <div className="min-w-0">
                <p className="font-medium break-words">{token.name}</p>
                <p className="text-xs text-ink-soft dark:text-night-ink-soft">
                  <code className="font-mono">{token.start}…</code> · made <When iso={token.createdAt} /> ·{' '}
                  {token.lastUsedAt ? (
                    <>
                      last used <When iso={token.lastUsedAt} />
                    </>
                  ) : (
                    'never used'
                  )}
                  {token.revokedAt && (
                    <>
                      {' '}
                      · revoked <When iso={token.revokedAt} />
                    </>
                  )}
                </p>
              </div>
              {!token.revokedAt && (
                <Button variant="secondary" aria-label={`Revoke ${token.name}`} disabled={revoke.isPending} onClick={() => revoke.mutate(token.id)}>
                  Revoke
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {revoke.isError && (
        <p role="alert" className="text-sm text-short dark:text-short-bright">
          Not revoked: {revoke.error.message}
        </p>
      )}
    </div>
  );
}
