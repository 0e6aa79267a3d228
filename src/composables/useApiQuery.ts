// Loading and error states of server data, the same way on every screen: a TanStack query under a
// key from src/queries/keys.ts, with `loading`, the data, and `error` already in a person's words
// (through errorMessage, the one place that words errors). A null key means "nothing to load yet".
//
//   const episodes = useApiQuery(() => keys.episodes(buildId.value), () => episodesApi.list(buildId.value), {
//     fallback: 'Could not load the episodes.',
//   });
//   <n-alert v-if="episodes.error.value" type="error">{{ episodes.error.value }}</n-alert>
import { computed } from 'vue';
import { keepPreviousData, useQuery, type QueryKey } from '@tanstack/vue-query';
import { errorMessage } from './errorMessage';

export interface ApiQueryOptions {
  /** The words shown when the error carries none of its own (a network failure, say). */
  fallback: string;
  /** Words for a status (a 404 that names what is missing). */
  byStatus?: Record<number, string>;
  /** Keeps the last answer on screen while the next page or filter loads. */
  keepPrevious?: boolean;
  /** How long an answer stays fresh (ms); live notices and writes invalidate it anyway. */
  staleTime?: number;
  /** While true the query keeps its data but is not read again (a form holds a draft of it). */
  paused?: () => boolean;
}

export function useApiQuery<T>(key: () => QueryKey | null, fetch: () => Promise<T>, opts: ApiQueryOptions) {
  const queryKey = computed(() => key() ?? ['idle']);
  const query = useQuery({
    queryKey,
    queryFn: fetch,
    enabled: computed(() => key() !== null && !opts.paused?.()),
    ...(opts.keepPrevious ? { placeholderData: keepPreviousData } : {}),
    ...(opts.staleTime !== undefined ? { staleTime: opts.staleTime } : {}),
  });
  /** The error in words, or '' while all is well. */
  const error = computed(() =>
    query.error.value ? errorMessage(query.error.value, opts.fallback, opts.byStatus) : '',
  );
  /** True while this key's answer is on its way (the first load, another page or filter). */
  const loading = computed(
    () => query.isFetching.value && (query.data.value === undefined || query.isPlaceholderData.value),
  );
  /** True while any request is out, a background refresh after a write or a live notice too. */
  const refreshing = computed(() => query.isFetching.value);
  return { data: query.data, loading, refreshing, error, refetch: () => query.refetch(), query };
}
