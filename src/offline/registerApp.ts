// Registers the service worker (built by vite-plugin-pwa, see vite.config.ts) the first time the
// person opens the shop floor: only the shop floor works offline, so other screens never pay for
// downloading the app shell. Once registered it serves the shell on every later visit.
import type { Router } from 'vue-router';

let registered = false;
const RELOADED = 'bayslate.reloadedFor';

export function registerOfflineApp(router: Router) {
  if (typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  router.afterEach((to) => {
    sessionStorage.removeItem(RELOADED);
    if (registered || to.name !== 'shop-floor') return;
    registered = true;
    navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch(() => (registered = false));
  });
  // A new release replaces the cached shell at once; a page still running the old one then cannot
  // load a screen's old file. Load the address afresh, once (never a loop when truly offline).
  router.onError((err: unknown, to) => {
    const text = err instanceof Error ? err.message : String(err);
    if (!/dynamically imported module|Importing a module script failed|error loading dynamically/i.test(text)) return;
    if (sessionStorage.getItem(RELOADED) === to.fullPath) return;
    sessionStorage.setItem(RELOADED, to.fullPath);
    window.location.assign(to.fullPath);
  });
}
