// Live updates of one build: listens to the server's event stream (GET /api/builds/:id/events) while
// the component is mounted and marks the build's queries stale (keys.build), so every screen that
// reads the build through a query re-fetches by itself; `onChange`, when given, hears what changed
// ("upgrades", "parts", … or "*" after a reconnect) for a screen that holds its own draft (the
// planner). A burst of notices within a short window becomes one call; EventSource reconnects by
// itself when the network comes back.
import { onBeforeUnmount, onMounted, ref, watch, type Ref } from 'vue';
import { useQueryClient } from '@tanstack/vue-query';
import { invalidateBuild } from '@/queries/keys';
import { BuildChange } from '@shared/contracts/events';

const GATHER_MS = 200;

export function useBuildEvents(
  buildId: Ref<number | null | undefined> | (() => number | null | undefined),
  onChange?: (what: string[]) => void,
) {
  const client = useQueryClient();
  const connected = ref(false);
  let source: EventSource | null = null;
  let timer: ReturnType<typeof setTimeout> | null = null;
  let gathered = new Set<string>();
  let opened = false;
  const read = () => (typeof buildId === 'function' ? buildId() : buildId.value);

  function fire() {
    timer = null;
    const what = [...gathered];
    gathered = new Set();
    const id = read();
    if (id) void invalidateBuild(client, id);
    onChange?.(what);
  }
  function queue(what: string[]) {
    what.forEach((w) => gathered.add(w));
    timer ??= setTimeout(fire, GATHER_MS);
  }
  function close() {
    source?.close();
    source = null;
    connected.value = false;
    opened = false;
  }
  function open(id: number | null | undefined) {
    close();
    if (!id || typeof EventSource === 'undefined') return;
    source = new EventSource(`/api/builds/${id}/events`);
    source.addEventListener('ready', () => {
      // A reconnect may have missed changes: fetch everything once more.
      if (opened) queue(['*']);
      opened = true;
      connected.value = true;
    });
    source.addEventListener('change', (e) => {
      // The notice is read with the shared contract; anything it does not match means "fetch everything".
      let parsed: ReturnType<typeof BuildChange.safeParse> | null = null;
      try {
        parsed = BuildChange.safeParse(JSON.parse((e as MessageEvent<string>).data));
      } catch {
        parsed = null;
      }
      queue(parsed?.success ? parsed.data.what : ['*']);
    });
    source.addEventListener('error', () => (connected.value = false));
  }

  onMounted(() => open(read()));
  watch(read, (id) => open(id));
  onBeforeUnmount(() => {
    close();
    if (timer) clearTimeout(timer);
  });
  return { connected };
}
