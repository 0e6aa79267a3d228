// Client entry: Pinia (client state), TanStack Query (server data), the router, the shipped Poppins font.
import { createApp } from 'vue';
import { createPinia } from 'pinia';
import { VueQueryPlugin } from '@tanstack/vue-query';
import '@fontsource/poppins/latin-400.css';
import '@fontsource/poppins/latin-500.css';
import '@fontsource/poppins/latin-600.css';
import App from './App.vue';
import { router } from './router';
import { setUnauthorizedHandler } from './api/http';
import { useSessionStore } from './stores/session';
import { registerOfflineApp } from './offline/registerApp';
import { queryClient } from './queries/client';

const app = createApp(App);
app.use(createPinia());
app.use(VueQueryPlugin, { queryClient });
app.use(router);
registerOfflineApp(router);
setUnauthorizedHandler(() => {
  const session = useSessionStore();
  if (session.user) {
    session.forget();
    router.push({ name: 'sign-in', query: { next: router.currentRoute.value.fullPath } });
  }
});
app.mount('#app');
