// The query client: no retries (an error shows at once, as before), no re-fetch on window focus
// (screens refresh on a live notice or after a write), and data re-read when a screen mounts.
import { QueryClient } from '@tanstack/vue-query';

export function createQueryClient() {
  return new QueryClient({
    defaultOptions: {
      queries: { retry: false, refetchOnWindowFocus: false, staleTime: 0 },
      mutations: { retry: false },
    },
  });
}

/** The app's one client (main.ts installs it; src/api/parts.ts reads the open build's time zone). */
export const queryClient = createQueryClient();
