/**
 * Comment threads of a proposal: the read, and the writes (a new thread, a reply, resolve or
 * reopen). Each write refreshes the threads and the proposal's record (the audit trail) and waits
 * for them, so the page shows the new state before the mutation settles.
 */
import {
  queryOptions,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { api } from "../../../config/paths";
import { apiClient } from "../../../lib/api";
import type { Items } from "#shared/api/lists";
import type { CommentInput, CommentThread } from "#shared/api/comments";
import { proposalKeys } from "../../../lib/query-keys";

export const commentsQuery = (proposalId: number) =>
  queryOptions({
    queryKey: proposalKeys.comments(proposalId),
    queryFn: () =>
      apiClient.get<Items<CommentThread>>(api.comments(proposalId)),
  });

function useRefreshThreads(proposalId: number) {
  const queryClient = useQueryClient();
  return async () => {
    await Promise.all([
      queryClient.invalidateQueries({
        queryKey: proposalKeys.comments(proposalId),
      }),
      queryClient.invalidateQueries({
        queryKey: proposalKeys.audit(proposalId),
      }),
    ]);
  };
}

export function usePostComment(proposalId: number) {
  const onSuccess = useRefreshThreads(proposalId);
  return useMutation({
    mutationFn: (body: CommentInput) =>
      apiClient.post<CommentThread>(api.comments(proposalId), body),
    onSuccess,
  });
}

export function useReplyToComment(proposalId: number) {
  const onSuccess = useRefreshThreads(proposalId);
  return useMutation({
    mutationFn: ({ threadId, body }: { threadId: number; body: string }) =>
      apiClient.post<CommentThread>(api.commentReplies(proposalId, threadId), {
        body,
      }),
    onSuccess,
  });
}

export function useThreadState(proposalId: number) {
  const onSuccess = useRefreshThreads(proposalId);
  return useMutation({
    mutationFn: ({
      threadId,
      resolved,
    }: {
      threadId: number;
      resolved: boolean;
    }) =>
      apiClient.patch<CommentThread>(api.commentThread(proposalId, threadId), {
        resolved,
      }),
    onSuccess,
  });
}
