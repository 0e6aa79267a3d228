// The "someone else saved first" choice (409 stale: reload theirs, or apply mine again on top),
// asked through the app's one confirmation dialog.
import { ApiError } from '@/api/http';
import { useConfirm } from './useConfirm';

export function isStale(e: unknown): e is ApiError {
  return e instanceof ApiError && e.status === 409 && e.code === 'stale';
}

/** The current record the server sent with a stale answer, if any. */
export function staleCurrent<T>(e: ApiError): T | null {
  return ((e.body as { current?: T }).current ?? null) as T | null;
}

export function useStaleChoice() {
  const confirm = useConfirm();
  return (what: string, actions: { reload: () => unknown; reapply: () => unknown }) =>
    confirm({
      title: 'Someone else changed this first',
      content: `${what} was saved by someone else while you were editing. Reload to see their version, or apply your change again on top of it.`,
      positiveText: 'Apply my change again',
      negativeText: 'Reload',
      maskClosable: false,
      onPositiveClick: () => {
        actions.reapply();
      },
      onNegativeClick: () => {
        actions.reload();
      },
    });
}
