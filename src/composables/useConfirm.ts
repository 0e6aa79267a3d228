// Asks before a destructive action: naive-ui's warning dialog, given an accessible name.
// naive's dialog carries role="dialog" without a name, so each one is named after its title
// once it is rendered (screen readers then announce what is asked). Every confirmation in the
// app goes through here.
import { useDialog, type DialogOptions } from 'naive-ui';

/** Names every unnamed dialog on the page after its own title, as soon as it is in the DOM. */
function nameDialogs(fallback: string, frames = 20) {
  const run = (left: number) => {
    const unnamed = [...document.querySelectorAll<HTMLElement>('.n-dialog[role="dialog"]:not([aria-label])')];
    for (const el of unnamed)
      el.setAttribute('aria-label', el.querySelector('.n-dialog__title')?.textContent?.trim() || fallback);
    if (!unnamed.length && left > 0) requestAnimationFrame(() => run(left - 1));
  };
  requestAnimationFrame(() => run(frames));
}

export function useConfirm() {
  const dialog = useDialog();
  return (opts: DialogOptions & { title: string }) => {
    const d = dialog.warning({ negativeText: 'Cancel', ...opts });
    nameDialogs(opts.title);
    return d;
  };
}
