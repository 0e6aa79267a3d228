// Asks before a destructive action. naive-ui's dialog box has no accessible name of its own, so
// the title is given to it as its label once it opens (screen readers announce what is asked).
import { useDialog } from 'naive-ui';

export interface ConfirmOptions {
  title: string;
  content: string;
  positiveText: string;
  negativeText?: string;
  tone?: 'warning' | 'error' | 'info';
  onConfirm: () => unknown;
}

export function useConfirm() {
  const dialog = useDialog();
  return (o: ConfirmOptions) =>
    dialog[o.tone ?? 'warning']({
      title: o.title,
      content: o.content,
      positiveText: o.positiveText,
      negativeText: o.negativeText ?? 'Cancel',
      onPositiveClick: () => o.onConfirm(),
      onAfterEnter: () =>
        document.querySelectorAll('.n-dialog[role="dialog"]:not([aria-label])').forEach((el) => el.setAttribute('aria-label', o.title)),
    });
}
