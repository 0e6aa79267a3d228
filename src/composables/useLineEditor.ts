// One way to edit the lines of an upgrade in the drawer (labour, expenses, parts, removed parts):
// the add/change form checks its body with the shared schema (useZodForm) before sending, the
// server's field errors land on their fields, every save or action says what it did (or why it
// failed, through errorMessage) and tells the drawer that something changed, and a delete asks
// first.
//
//   const editor = useLineEditor(createLabourSchema, () => emit('changed'));
//   await editor.save(body, (b) => labourApi.create(buildId, b), { done: 'Hours logged.', failed: 'Could not log the hours.' });
//   editor.confirmRemove({ title: 'Delete this time entry?', …, send: () => labourApi.remove(buildId, id) });
import { ref } from 'vue';
import type { ZodType } from 'zod';
import { useMessage } from 'naive-ui';
import { useConfirm } from './useConfirm';
import { errorMessage, fieldErrorsOf } from './errorMessage';
import { useZodForm } from './useZodForm';

export interface SaveTexts {
  /** The toast of a save that went through. */
  done: string;
  /** The words of a failure the server did not word itself. */
  failed: string;
  /** Checks the body with this schema instead (the update schema of a form that also creates). */
  schema?: ZodType;
  /** Sees a failure first (a stale save, say); return true when it has told the person itself. */
  onError?: (e: unknown) => boolean;
}

export interface RemoveOptions {
  title: string;
  content: string;
  positiveText: string;
  send: () => Promise<unknown>;
  done: string;
  failed: string;
}

export const FIELDS_NEED_ATTENTION = 'Some fields need attention.';

export function useLineEditor<S extends ZodType>(schema: S, changed: () => void) {
  const form = useZodForm(schema);
  const message = useMessage();
  const confirm = useConfirm();
  /** The add form is open. */
  const open = ref(false);

  /**
   * Checks `body` with the shared schema, sends it, says so and closes the form; returns false
   * (with the field errors shown) when the body is refused here or by the server.
   */
  async function save<B>(body: B, send: (body: B) => Promise<unknown>, texts: SaveTexts): Promise<boolean> {
    if (form.check(body, texts.schema) === null) {
      message.error(FIELDS_NEED_ATTENTION);
      return false;
    }
    form.busy.value = true;
    try {
      await send(body);
      message.success(texts.done);
      open.value = false;
      changed();
      return true;
    } catch (e) {
      form.errors.value = fieldErrorsOf(e);
      if (!texts.onError?.(e))
        message.error(Object.keys(form.errors.value).length ? FIELDS_NEED_ATTENTION : errorMessage(e, texts.failed));
      return false;
    } finally {
      form.busy.value = false;
    }
  }

  /** A one-step change of a line (mark received, sold…): says what it did or why it failed. */
  async function act(
    send: () => Promise<unknown>,
    done: string,
    failed: string | ((e: unknown) => string),
  ): Promise<boolean> {
    try {
      await send();
      message.success(done);
      changed();
      return true;
    } catch (e) {
      message.error(typeof failed === 'function' ? failed(e) : errorMessage(e, failed));
      return false;
    }
  }

  /** Asks before deleting a line, then deletes it. */
  function confirmRemove(o: RemoveOptions) {
    confirm({
      title: o.title,
      content: o.content,
      positiveText: o.positiveText,
      negativeText: 'Keep it',
      onPositiveClick: () => act(o.send, o.done, o.failed).then(() => undefined),
    });
  }

  /** naive-ui form-item props of one field: its error text and status. */
  const fb = (k: string) => ({
    feedback: form.errors.value[k],
    'validation-status': form.errors.value[k] ? ('error' as const) : undefined,
  });

  return { open, errors: form.errors, saving: form.busy, save, act, confirmRemove, fb, clear: form.clear };
}
