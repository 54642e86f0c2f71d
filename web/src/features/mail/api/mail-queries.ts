import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Mailbox } from '#shared/api/admin';

export const mailKeys = { all: ['mail'] as const, inbox: () => ['mail', 'inbox'] as const };

/** The local mail server's messages, newest first (admins only: anyone else gets a 403). Refreshed every 15 s while open. */
export const mailboxQuery = () =>
  queryOptions({
    queryKey: mailKeys.inbox(),
    queryFn: () => apiClient.get<Mailbox>(api.adminMail),
    refetchInterval: 15_000,
  });
