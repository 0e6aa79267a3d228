// The one place that turns an error into the words a person sees: the server's own message when it
// sent one (ApiError), a given message for a status (a 404 on a screen that names what is missing),
// and the screen's fallback otherwise ("Could not load the backlog.").
import { ApiError } from '@/api/http';

export function errorMessage(e: unknown, fallback: string, byStatus: Record<number, string> = {}): string {
  if (e instanceof ApiError) return byStatus[e.status] ?? e.message;
  return fallback;
}

/** The server's field errors of a failed save, by field path (first message of each field). */
export function fieldErrorsOf(e: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  if (e instanceof ApiError) for (const f of e.fields) out[f.path] ??= f.message;
  return out;
}

/** One field's message from the server when it named that field, else the error in words. */
export function fieldOrMessage(e: unknown, path: string, fallback: string): string {
  return (e instanceof ApiError && e.field(path)) || errorMessage(e, fallback);
}
