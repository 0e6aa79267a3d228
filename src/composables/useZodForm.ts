// One way to run a form: validate with the shared zod schema before sending, then put the
// server's field errors (ApiError.fields) on the same fields, and anything else in one message.
//
//   const form = useZodForm(createExpenseSchema);
//   async function save() {
//     const saved = await form.submit(body(), (data) => expensesApi.create(buildId, data));
//     if (saved) message.success('Expense added.');
//   }
//   <n-form-item :validation-status="form.errors.value.amountCents ? 'error' : undefined"
//                :feedback="form.errors.value.amountCents"> …
import { ref } from 'vue';
import type { z, ZodType } from 'zod';
import { ApiError } from '@/api/http';

/** Errors by field path ('amountCents', 'chapters.1.start'); the first problem of each field. */
export type FieldErrors = Record<string, string>;

export interface SubmitOptions {
  /** Sees an error first (a stale save, say); return true when it has dealt with it. */
  onError?: (e: unknown) => boolean;
  /** Checks with this schema instead (a form that sends one of two bodies). */
  schema?: ZodType;
}

const NOT_SENT = 'That did not go through. Try again in a moment.';

export function useZodForm<S extends ZodType>(schema: S) {
  const errors = ref<FieldErrors>({});
  /** A problem that belongs to no one field (shown above the buttons). */
  const failure = ref('');
  const busy = ref(false);

  function clear() {
    errors.value = {};
    failure.value = '';
  }

  /**
   * Validates with the shared schema (or `other`, say the update schema of a form that also
   * creates); fills `errors` and returns null when something is wrong.
   */
  function check(body: unknown, other?: ZodType): z.output<S> | null {
    clear();
    const parsed = (other ?? schema).safeParse(body);
    if (parsed.success) return parsed.data as z.output<S>;
    const next: FieldErrors = {};
    for (const issue of parsed.error.issues) next[issue.path.map(String).join('.') || '(form)'] ??= issue.message;
    errors.value = next;
    return null;
  }

  /** Puts an error from the server where the person will see it. */
  function showError(e: unknown) {
    if (e instanceof ApiError) {
      if (e.fields.length) {
        const next: FieldErrors = {};
        for (const f of e.fields) next[f.path] ??= f.message;
        errors.value = next;
      } else failure.value = e.message;
    } else failure.value = NOT_SENT;
  }

  /**
   * Checks `body`, sends the parsed value with `send`, and returns its answer; returns undefined
   * (with the errors shown) when the body is refused here or by the server.
   */
  async function submit<T>(
    body: unknown,
    send: (data: z.output<S>) => Promise<T>,
    opts: SubmitOptions = {},
  ): Promise<T | undefined> {
    const data = check(body, opts.schema);
    if (data === null) return undefined;
    busy.value = true;
    try {
      return await send(data);
    } catch (e) {
      if (!opts.onError?.(e)) showError(e);
      return undefined;
    } finally {
      busy.value = false;
    }
  }

  /** The error of one field, or undefined. */
  const errorOf = (path: string): string | undefined => errors.value[path];

  return { errors, failure, busy, check, submit, showError, clear, errorOf };
}
