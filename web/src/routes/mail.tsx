import type { QueryClient } from '@tanstack/react-query';
import { useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { mayAs } from '#shared/workflow/roles';
import { RouteError } from '../components/layout/route-error';
import { Button } from '../components/ui/button';
import { PageHeader } from '../components/ui/page-header';
import { paths } from '../config/paths';
import { meQuery } from '../lib/auth-queries';
import { mailboxQuery, mailKeys } from '../features/mail/api/mail-queries';
import { MailReader } from '../features/mail/components/mail-reader';

/** The mailbox for an admin; nobody else is asked for it (the server would refuse). */
export const loader = (queryClient: QueryClient) => async () => {
  const user = await queryClient.ensureQueryData(meQuery());
  if (user && mayAs(user, null, 'mail:read')) await queryClient.ensureQueryData(mailboxQuery());
  return null;
};

export function Component() {
  const { data: user } = useSuspenseQuery(meQuery());
  if (!user) return null;
  if (!mayAs(user, null, 'mail:read')) return <NotAllowed />;
  return <Mail />;
}

function NotAllowed() {
  return (
    <div role="alert" className="mx-auto max-w-xl py-16">
      <h1 className="text-2xl font-medium">Not allowed</h1>
      <p className="mt-2 text-ink-soft dark:text-night-ink-soft">Only an administrator reads the local mail server’s messages. Your own e-mail setting is on your profile.</p>
      <Link to={paths.profile.href()} className="mt-4 inline-block text-fern underline dark:text-fern-bright">
        Your profile
      </Link>
    </div>
  );
}

function Mail() {
  const queryClient = useQueryClient();
  const { data: mailbox, isFetching } = useSuspenseQuery(mailboxQuery());
  const { pending, failed } = mailbox.outbox;
  return (
    <>
      <PageHeader
        title="Mail"
        eyebrow="Administration"
        actions={
          <Button variant="secondary" disabled={isFetching} onClick={() => queryClient.invalidateQueries({ queryKey: mailKeys.all })}>
            {isFetching ? 'Refreshing…' : 'Refresh'}
          </Button>
        }
      >
        What Longtail’s built-in local mail server received: every workflow e-mail, newest first ({mailbox.total} in all
        {mailbox.total > mailbox.items.length ? `, the newest ${mailbox.items.length} shown` : ''}).
      </PageHeader>
      <p role="status" className="mb-4 text-sm text-ink-soft dark:text-night-ink-soft">
        Outbox: {pending === 0 ? 'nothing waiting' : `${pending} waiting to be sent`}
        {failed > 0 ? `; ${failed} given up after every retry` : ''}.
      </p>
      <MailReader messages={mailbox.items} />
    </>
  );
}

export const ErrorBoundary = RouteError;
