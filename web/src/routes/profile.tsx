import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { heldRoleTitles } from '#shared/workflow/roles';
import { RouteError } from '../components/layout/route-error';
import { PageHeader } from '../components/ui/page-header';
import { Sheet } from '../components/ui/sheet';
import { meQuery } from '../lib/auth-queries';
import { ApiTokensSection } from '../features/profile/components/api-tokens-section';
import { NotificationSettings } from '../features/profile/components/notification-settings';
import { PasswordChangeForm } from '../features/profile/components/password-change-form';

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.ensureQueryData(meQuery());
  return null;
};

/** Your own account: who you are here, your password, which e-mails Longtail sends you, and your API tokens. */
export function Component() {
  const { data: user } = useSuspenseQuery(meQuery());
  if (!user) return null;
  return (
    <>
      <PageHeader title="Your profile" eyebrow="Account">
        Your name and your role in each project are set by an administrator; your password, which e-mails you get and your API tokens are yours.
      </PageHeader>
      <div className="grid max-w-3xl gap-6">
        <Sheet title="Account" aria-label="Account">
          <dl className="grid grid-cols-[8rem_minmax(0,1fr)] gap-y-1.5 text-sm">
            <dt className="text-ink-soft dark:text-night-ink-soft">Name</dt>
            <dd>{user.displayName}</dd>
            <dt className="text-ink-soft dark:text-night-ink-soft">E-mail</dt>
            <dd>{user.email}</dd>
            <dt className="text-ink-soft dark:text-night-ink-soft">Roles</dt>
            <dd>{heldRoleTitles(user).join(', ') || 'None yet: an administrator adds you to a project with a role.'}</dd>
          </dl>
        </Sheet>
        <Sheet title="Password" aria-label="Password">
          <p className="mb-3 text-sm text-ink-soft dark:text-night-ink-soft">Changing it signs you out everywhere else; this browser stays signed in.</p>
          <PasswordChangeForm />
        </Sheet>
        <Sheet title="E-mail notifications" aria-label="E-mail notifications">
          <NotificationSettings user={user} />
        </Sheet>
        <Sheet title="API tokens" aria-label="API tokens">
          <ApiTokensSection />
        </Sheet>
      </div>
    </>
  );
}

export const ErrorBoundary = RouteError;
