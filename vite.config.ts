// Client build and dev server. The API is proxied to the Express server in development.
import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import { VitePWA } from 'vite-plugin-pwa';
import { fileURLToPath } from 'node:url';

const apiPort = process.env.BAYSLATE_API_PORT ?? '3000';

export default defineConfig({
  plugins: [
    vue(),
    // The installable app and its service worker (issue 14): the app shell is precached so the shop
    // floor opens without the network; API answers are never cached by it (the shop floor keeps its
    // own last answer in IndexedDB, src/offline/). Registered by src/offline/registerApp.ts.
    VitePWA({
      registerType: 'autoUpdate',
      injectRegister: false,
      includeAssets: ['favicon.svg'],
      manifest: {
        name: 'Bayslate',
        short_name: 'Bayslate',
        description:
          'Plan, build, film and publish a vehicle upgrade series; the shop floor works in the bay, offline too.',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        theme_color: '#25272b',
        background_color: '#f1ede4',
        icons: [
          { src: '/icons/bayslate-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/bayslate-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icons/bayslate-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,woff2}'],
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//, /^\/dev\//],
        cleanupOutdatedCaches: true,
        clientsClaim: true,
        skipWaiting: true,
        inlineWorkboxRuntime: true,
        maximumFileSizeToCacheInBytes: 4 * 1024 * 1024,
      },
    }),
  ],
  resolve: {
    alias: {
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
      '@': fileURLToPath(new URL('./src', import.meta.url)),
    },
  },
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: {
      '/api': `http://127.0.0.1:${apiPort}`,
      '/dev/mail': `http://127.0.0.1:${apiPort}`,
    },
  },
  build: { outDir: 'dist', emptyOutDir: true, chunkSizeWarningLimit: 900 },
});
