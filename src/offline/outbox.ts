// Sending the outbox: one action at a time, strictly in the order they were made. An action the
// server accepts leaves the outbox; one it refuses (a stale version's 409, a rule's 4xx) moves to the
// refusals the person sees; anything else (no network, signed out, server trouble) stops the run and
// keeps the action for the next one. Undo of a waiting action takes it out before it is sent.
import { ApiError } from '@/api/http';
import type { NewAction, OfflineStore, QueuedAction, Refusal } from './store';

export interface SendHooks {
  /** Sends one action; throws ApiError when the server refuses or cannot be reached. */
  send: (action: QueuedAction) => Promise<unknown>;
  onSent?: (action: QueuedAction, result: unknown) => void;
  onRefused?: (refusal: Refusal) => void;
  /** Called whenever the outbox or the refusals changed. */
  onChange?: () => void;
}

/** True when the error means "try again later" rather than "the server said no". */
export function isRetryable(e: unknown): boolean {
  if (!(e instanceof ApiError)) return true;
  return e.status === 0 || e.status === 401 || e.status === 408 || e.status === 429 || e.status >= 500;
}

export type FlushResult = { sent: number; refused: number; stopped: boolean };
export type CancelResult = { removed: true } | { removed: false; sentResult: unknown };

export function createOutbox(store: OfflineStore, userId: number, hooks: SendHooks) {
  let lock: Promise<unknown> = Promise.resolve();
  /** Runs `fn` alone: picking the next action to send and cancelling one never interleave. */
  function exclusive<T>(fn: () => Promise<T>): Promise<T> {
    const run = lock.then(fn, fn);
    lock = run.catch(() => undefined);
    return run;
  }
  let running: Promise<FlushResult> | null = null;
  let again = false;
  /** Results of sent actions by seq, so an undo that came too late can step the mark back. */
  const sentResults = new Map<number, unknown>();
  let sending: { seq: number; done: Promise<void> } | null = null;

  async function sendOne(): Promise<'empty' | 'sent' | 'refused' | 'stopped'> {
    let release!: () => void;
    const picked = await exclusive(async () => {
      const next = await store.first(userId);
      if (next) sending = { seq: next.seq!, done: new Promise<void>((r) => (release = r)) };
      return next;
    });
    if (!picked) return 'empty';
    try {
      const result = await hooks.send(picked);
      await store.remove(picked.seq!);
      sentResults.set(picked.seq!, result);
      hooks.onSent?.(picked, result);
      return 'sent';
    } catch (e) {
      if (isRetryable(e)) return 'stopped';
      const err = e as ApiError;
      const refusal = await store.refuse(picked, err.status, err.message);
      hooks.onRefused?.(refusal);
      return 'refused';
    } finally {
      sending = null;
      release();
      hooks.onChange?.();
    }
  }

  async function run(): Promise<FlushResult> {
    const result: FlushResult = { sent: 0, refused: 0, stopped: false };
    for (;;) {
      const r = await sendOne();
      if (r === 'empty') return result;
      if (r === 'stopped') return { ...result, stopped: true };
      result[r]++;
    }
  }

  return {
    async enqueue(action: NewAction): Promise<number> {
      const seq = await store.enqueue(action);
      hooks.onChange?.();
      return seq;
    },
    /** Sends everything waiting, in order; a call during a run makes the run go round once more. */
    flush(): Promise<FlushResult> {
      if (running) {
        again = true;
        return running;
      }
      running = (async () => {
        let total: FlushResult = { sent: 0, refused: 0, stopped: false };
        do {
          again = false;
          const r = await run();
          total = { sent: total.sent + r.sent, refused: total.refused + r.refused, stopped: r.stopped };
          if (r.stopped) break;
        } while (again);
        return total;
      })().finally(() => (running = null));
      return running;
    },
    /**
     * Undo of a waiting action: removes it if it has not gone yet. If it is being sent right now
     * this waits for the answer; then (or if it already went) answers what the server gave back.
     */
    async cancel(seq: number): Promise<CancelResult> {
      for (;;) {
        const step = await exclusive(async () =>
          sending?.seq === seq ? { wait: sending.done } : { removed: await store.remove(seq) },
        );
        // Being sent now: wait for the answer, then look again (a run stopped by the network leaves it waiting).
        if ('wait' in step) {
          await step.wait;
          continue;
        }
        if (step.removed) {
          hooks.onChange?.();
          return { removed: true };
        }
        return { removed: false, sentResult: sentResults.get(seq) };
      }
    },
  };
}
export type Outbox = ReturnType<typeof createOutbox>;
