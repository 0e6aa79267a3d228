// The shop floor's outbox as screen state: what is waiting to send (photos with their progress),
// what the server refused, whether the browser is online; sending starts when the network comes
// back, when something is added while online, and every little while as long as anything waits
// (a phone can say "online" on a Wi-Fi that reaches nothing). One outbox per signed-in person.
import { computed, onBeforeUnmount, reactive, shallowRef } from 'vue';
import { offlineStore, type NewAction, type QueuedAction, type Refusal } from '@/offline/store';
import { createOutbox, type Outbox } from '@/offline/outbox';
import { sendAction } from '@/offline/send';

const RETRY_MS = 15_000;

const waiting = shallowRef<QueuedAction[]>([]);
const refusals = shallowRef<Refusal[]>([]);
const live = reactive({
  online: typeof navigator === 'undefined' ? true : navigator.onLine,
  sendingSeq: null as number | null,
  progress: {} as Record<number, number>,
});
const sentListeners = new Set<(action: QueuedAction, result: unknown) => void>();
const refusedListeners = new Set<(refusal: Refusal) => void>();
let current: { userId: number; outbox: Outbox } | null = null;
let timer: ReturnType<typeof setInterval> | null = null;
let watching = false;

async function refresh() {
  if (!current) return;
  const userId = current.userId;
  const [w, r] = await Promise.all([offlineStore.queued(userId), offlineStore.refusals(userId)]);
  if (current?.userId !== userId) return;
  waiting.value = w;
  refusals.value = r;
}

function flush() {
  if (!current || !live.online) return Promise.resolve();
  return current.outbox.flush().then(() => undefined);
}

function watchNetwork() {
  if (watching || typeof window === 'undefined') return;
  watching = true;
  window.addEventListener('online', () => {
    live.online = true;
    void flush();
  });
  window.addEventListener('offline', () => (live.online = false));
  timer = setInterval(() => {
    if (waiting.value.length) void flush();
  }, RETRY_MS);
}

function outboxFor(userId: number): Outbox {
  if (current?.userId === userId) return current.outbox;
  const outbox = createOutbox(offlineStore, userId, {
    send: (action) => {
      live.sendingSeq = action.seq!;
      live.progress = { ...live.progress, [action.seq!]: 0 };
      return sendAction(action, (f) => (live.progress = { ...live.progress, [action.seq!]: f })).finally(
        () => (live.sendingSeq = null),
      );
    },
    onSent: (action, result) => sentListeners.forEach((fn) => fn(action, result)),
    onRefused: (refusal) => refusedListeners.forEach((fn) => fn(refusal)),
    onChange: () => void refresh(),
  });
  current = { userId, outbox };
  waiting.value = [];
  refusals.value = [];
  void refresh().then(flush);
  return outbox;
}

/** Stops the retry timer (component tests). */
export function stopOutboxTimer() {
  if (timer) clearInterval(timer);
  timer = null;
  watching = false;
}

export function useOutbox(
  userId: number,
  handlers: { onSent?: (action: QueuedAction, result: unknown) => void; onRefused?: (refusal: Refusal) => void } = {},
) {
  const outbox = outboxFor(userId);
  watchNetwork();
  if (handlers.onSent) sentListeners.add(handlers.onSent);
  if (handlers.onRefused) refusedListeners.add(handlers.onRefused);
  onBeforeUnmount(() => {
    if (handlers.onSent) sentListeners.delete(handlers.onSent);
    if (handlers.onRefused) refusedListeners.delete(handlers.onRefused);
  });

  return {
    waiting: computed(() => waiting.value),
    refusals: computed(() => refusals.value),
    online: computed(() => live.online),
    sendingSeq: computed(() => live.sendingSeq),
    progress: computed(() => live.progress),
    /** New actions join the queue while offline or while older ones still wait (nothing overtakes). */
    shouldQueue: () => !live.online || waiting.value.length > 0,
    async enqueue(action: NewAction): Promise<number> {
      const seq = await outbox.enqueue(action);
      await refresh();
      void flush();
      return seq;
    },
    cancel: (seq: number) => outbox.cancel(seq),
    async dismiss(id: number) {
      await offlineStore.dismiss(id);
      await refresh();
    },
    flush,
  };
}
export type UseOutbox = ReturnType<typeof useOutbox>;
