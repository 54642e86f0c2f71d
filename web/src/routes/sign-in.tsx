import { useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { Button } from '../components/ui/button';
import { paths } from '../config/paths';
import { authKeys, signIn } from '../lib/auth-queries';
import { ApiError } from '../lib/api';

export function Component() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const user = await signIn(email, password);
      queryClient.setQueryData(authKeys.me(), user);
      const next = params.get('next');
      navigate(next && next.startsWith('/') && !next.startsWith('//') ? next : paths.home.href(), { replace: true });
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'Sign-in failed.');
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
        <h1 className="text-lg font-medium">Sign in</h1>
        <p className="mb-4 text-sm text-ink-soft dark:text-night-ink-soft">Tail sizing for differential input stages, with the reasoning kept.</p>
        <form onSubmit={onSubmit} className="space-y-3 rounded-lg border border-rule bg-sheet p-4 dark:border-night-rule dark:bg-night-sheet" noValidate>
          <label className="block text-sm">
            <span className="mb-1 block font-medium">E-mail address</span>
            <input type="email" autoComplete="username" required value={email} onChange={(e) => setEmail(e.target.value)} className="w-full rounded-md border border-rule bg-sheet px-3 py-2 dark:border-night-rule dark:bg-night" />
          </label>
          <label className="block text-sm">
            <span className="mb-1 block font-medium">Password</span>
            <input type="password" autoComplete="current-password" required value={password} onChange={(e) => setPassword(e.target.value)} className="w-full rounded-md border border-rule bg-sheet px-3 py-2 dark:border-night-rule dark:bg-night" />
          </label>
          {error && (
            <p role="alert" className="text-sm text-short dark:text-short-bright">
              {error}
            </p>
          )}
          <Button type="submit" disabled={busy || !email || !password} className="w-full">
            {busy ? 'Signing in…' : 'Sign in'}
          </Button>
        </form>
        <p className="mt-4 text-xs text-ink-soft dark:text-night-ink-soft">Forgot your password? An administrator can mail you a one-time link to set a new one.</p>
        <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">
          Demo accounts: admin@, requirements@, designer@ or reviewer@demo.longtail.test with the demo password from the README.
        </p>
      </div>
    </main>
  );
}
