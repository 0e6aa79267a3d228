// Dialogs for the backlog screens: "someone else saved first" (409 stale: reload theirs, or apply
// mine again on top) and confirmations before destructive actions. naive-ui's dialogs carry
// role="dialog" without a name, so each one is named after its title for screen readers.
import { useDialog, type DialogOptions } from 'naive-ui';
import { ApiError } from '@/api/http';

export function isStale(e: unknown): e is ApiError {
  return e instanceof ApiError && e.status === 409 && e.code === 'stale';
}

/** The current record the server sent with a stale answer, if any. */
export function staleCurrent<T>(e: ApiError): T | null {
  return ((e.body as { current?: T }).current ?? null) as T | null;
}

/** Gives every unnamed dialog on the page its title as accessible name, once it is rendered. */
function nameDialogs(title: string, frames = 20) {
  const run = (left: number) => {
    const unnamed = [...document.querySelectorAll<HTMLElement>('.n-dialog[role="dialog"]:not([aria-label])')];
    for (const el of unnamed) el.setAttribute('aria-label', el.querySelector('.n-dialog__title')?.textContent?.trim() || title);
    if (!unnamed.length && left > 0) requestAnimationFrame(() => run(left - 1));
  };
  requestAnimationFrame(() => run(frames));
}

/** dialog.warning with an accessible name. */
export function useConfirm() {
  const dialog = useDialog();
  return (opts: DialogOptions & { title: string }) => {
    const d = dialog.warning(opts);
    nameDialogs(opts.title);
    return d;
  };
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
