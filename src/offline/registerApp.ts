// Registers the service worker (built by vite-plugin-pwa, see vite.config.ts) the first time the
// person opens the shop floor: only the shop floor works offline, so other screens never pay for
// downloading the app shell. Once registered it serves the shell on every later visit.
import type { Router } from 'vue-router';

let registered = false;

export function registerOfflineApp(router: Router) {
  if (typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  router.afterEach((to) => {
    if (registered || to.name !== 'shop-floor') return;
    registered = true;
    navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch(() => (registered = false));
  });
}
