import { useQuery, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, NavLink, Outlet, useNavigate } from 'react-router-dom';
import type { WaitingCounts } from '#shared/api/waiting';
import { heldRoleTitles, mayAs } from '#shared/workflow/roles';
import { paths } from '../../config/paths';
import { meQuery, signOut } from '../../lib/auth-queries';
import { cn } from '../../lib/cn';
import { applyTheme, storedTheme, type ThemeChoice } from '../../lib/theme';
import { mayWait, waitingCountsQuery, waitingSentence, waitingTotal } from '../../lib/waiting-queries';
import { SearchBox } from '../search/search-box';

const navClass = ({ isActive }: { isActive: boolean }) =>
  cn('rounded-md px-3 py-1.5 text-sm', isActive ? 'bg-fern-soft text-fern dark:bg-night dark:text-fern-bright' : 'text-ink-soft hover:text-ink dark:text-night-ink-soft dark:hover:text-night-ink');

const NEXT_THEME: Record<ThemeChoice, ThemeChoice> = { system: 'light', light: 'dark', dark: 'system' };
const THEME_WORDS: Record<ThemeChoice, string> = { system: 'system', light: 'light', dark: 'dark' };

/** The count of what waits for the person, linking to the home page's list; its name reads the count, then each kind in words. */
function WaitingLink({ counts }: { counts: WaitingCounts }) {
  const total = waitingTotal(counts);
  return (
    <Link to={paths.waiting.href()} className={cn(navClass({ isActive: false }), 'inline-flex items-center gap-1.5')} title={waitingSentence(counts)}>
      Waiting
      <span
        data-waiting-count={total}
        className={cn(
          'min-w-5 rounded-sm px-1 text-center text-xs font-medium tabular-nums',
          total > 0 ? 'bg-fern text-sheet dark:bg-fern-bright dark:text-night' : 'border border-rule text-ink-soft dark:border-night-rule dark:text-night-ink-soft',
        )}
      >
        {total}
      </span>
      <span className="sr-only">: {waitingSentence(counts)}</span>
    </Link>
  );
}

/** The signed-in frame: wordmark, navigation the role may use, theme, the user and sign-out. */
export function AppShell() {
  const { data: user } = useSuspenseQuery(meQuery());
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const [theme, setTheme] = useState<ThemeChoice>(storedTheme);
  const waiting = useQuery({ ...waitingCountsQuery(), enabled: mayWait(user) });
  if (!user) return null;
  const onSignOut = async () => {
    await signOut().catch(() => undefined);
    queryClient.clear();
    navigate(paths.signIn.href());
  };
  const cycleTheme = () => {
    const next = NEXT_THEME[theme];
    applyTheme(next);
    setTheme(next);
  };
  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:rounded focus:bg-sheet focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header data-app-frame className="border-b border-rule bg-sheet/80 backdrop-blur dark:border-night-rule dark:bg-night-sheet/80">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-3 gap-y-1 px-4 py-2.5 sm:gap-x-6">
          <NavLink to={paths.home.href()} className="flex items-center gap-2 text-lg font-medium tracking-tight text-fern dark:text-fern-bright">
            <img src="/longtail.svg" alt="" className="h-6 w-6" />
            longtail
          </NavLink>
          <nav aria-label="Main" className="flex items-center gap-1">
            <NavLink to={paths.home.href()} end className={navClass}>
              Projects
            </NavLink>
            {mayWait(user) && waiting.data && waiting.data.kinds.length > 0 && <WaitingLink counts={waiting.data} />}
            {mayAs(user, null, 'users:manage') && (
              <NavLink to={paths.people.href()} className={navClass}>
                People
              </NavLink>
            )}
            {mayAs(user, null, 'mail:read') && (
              <NavLink to={paths.mail.href()} className={navClass}>
                Mail
              </NavLink>
            )}
          </nav>
          <SearchBox />
          <div className="ml-auto flex items-center gap-2 text-sm sm:gap-3">
            <button type="button" onClick={cycleTheme} className="rounded-md px-2 py-1 text-ink-soft hover:text-ink dark:text-night-ink-soft dark:hover:text-night-ink">
              <span className="max-sm:sr-only">Theme: </span>
              <span className="max-sm:capitalize">{THEME_WORDS[theme]}</span>
            </button>
            <NavLink to={paths.profile.href()} title="Your profile and e-mail setting" className="text-right leading-tight hover:underline">
              <span className="sr-only">Your profile: </span>
              <span className="hidden sm:block">{user.displayName}</span>
              <span className="hidden text-xs text-ink-soft sm:block dark:text-night-ink-soft">{heldRoleTitles(user).join(' · ') || 'Member'}</span>
              <span className="sm:hidden">Profile</span>
            </NavLink>
            <button type="button" onClick={onSignOut} className="rounded-md border border-rule px-2.5 py-1 hover:bg-paper dark:border-night-rule dark:hover:bg-night">
              Sign out
            </button>
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-7xl px-4 py-6">
        <Outlet />
      </main>
      <footer data-app-frame className="mx-auto max-w-7xl px-4 pb-8 text-xs text-ink-soft dark:text-night-ink-soft">
        Figures are engineering estimates; confirm them by SPICE simulation and bench measurement before committing a design.
      </footer>
    </div>
  );
}
