import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import { build, type Plugin, type Rolldown } from 'vite';
import react from '@vitejs/plugin-react';
import { VitePWA } from 'vite-plugin-pwa';

/**
 * The service worker's outbox script (`/sw-outbox.js`, loaded by Workbox's importScripts), built from
 * src/sw/outbox-sync.ts with the page's own outbox code, so the worker sends with the same rules as the page.
 */
function outboxWorker(): Plugin {
  return {
    name: 'cj-sw-outbox',
    apply: 'build',
    async generateBundle() {
      const out = await build({
        configFile: false,
        root: fileURLToPath(new URL('.', import.meta.url)),
        logLevel: 'warn',
        build: {
          write: false,
          minify: true,
          lib: { entry: fileURLToPath(new URL('./src/sw/outbox-sync.ts', import.meta.url)), formats: ['iife'], name: 'cjOutboxSync' },
        },
      });
      const first = (Array.isArray(out) ? out[0] : out) as Rolldown.RolldownOutput;
      const chunk = first.output.find((o) => o.type === 'chunk');
      if (!chunk) throw new Error('the outbox worker script was not built');
      this.emitFile({ type: 'asset', fileName: 'sw-outbox.js', source: chunk.code });
    },
  };
}

/**
 * The installable app: a service worker (Workbox) that keeps the app shell, every page's code and the fonts, and
 * answers the API's GETs from the network first, from its cache when the server cannot be reached. A response taken
 * from that cache carries `x-cj-cached-at` (when the server sent it), so the screens say "figures as of".
 * Never in vitest: `disable` leaves the register module a no-op there.
 */
const pwa = VitePWA({
  disable: !!process.env.VITEST,
  registerType: 'prompt',
  injectRegister: false,
  includeAssets: ['favicon.svg', 'icons/apple-touch-icon-180.png'],
  manifest: {
    id: '/',
    name: 'Crankjournal',
    short_name: 'Crankjournal',
    description: 'Run logbook, pre-start checklists and alarms for the mill engine',
    start_url: '/',
    scope: '/',
    display: 'standalone',
    orientation: 'any',
    background_color: '#181917',
    theme_color: '#2a2c2b',
    icons: [
      { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
      { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
      { src: '/icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
    ],
  },
  workbox: {
    globPatterns: ['**/*.{js,css,html,svg,png,woff2,webmanifest}'],
    navigateFallback: '/index.html',
    navigateFallbackDenylist: [/^\/api\//, /^\/socket\.io\//],
    cleanupOutdatedCaches: true,
    // The first install takes over the open page at once, so what it reads is kept; a new version still waits for
    // "Reload to update" (no skipWaiting).
    clientsClaim: true,
    importScripts: ['/sw-outbox.js'],
    runtimeCaching: [
      {
        // Everything a crew reads at the engine (engine, points and limits, runs, checklists and templates, board,
        // alarms...); not sign-in, the API description or downloads.
        urlPattern: ({ url, request, sameOrigin }) =>
          sameOrigin &&
          request.method === 'GET' &&
          url.pathname.startsWith('/api/') &&
          !/^\/api\/(auth|docs)/.test(url.pathname) &&
          !/\.(pdf|csv)$/.test(url.pathname),
        handler: 'NetworkFirst',
        options: {
          cacheName: 'cj-api',
          networkTimeoutSeconds: 6,
          expiration: { maxEntries: 400, maxAgeSeconds: 14 * 24 * 3600 },
          cacheableResponse: { statuses: [200] },
          plugins: [
            {
              cachedResponseWillBeUsed: async ({ cachedResponse }) => {
                if (!cachedResponse) return cachedResponse;
                const headers = new Headers(cachedResponse.headers);
                headers.set('x-cj-cached-at', cachedResponse.headers.get('date') ?? '');
                const body = await cachedResponse.blob();
                return new Response(body, { status: cachedResponse.status, statusText: cachedResponse.statusText, headers });
              },
            },
          ],
        },
      },
    ],
  },
});

/**
 * The live run page's code in three files instead of dozens, each the modules that its roots statically import less
 * what an earlier one (or the first page: main.tsx and what it imports) already has, and less what the 'vendor' and
 * 'icons' groups take: 'live-data' (the page's queries, which App.tsx starts before the rest of its code is in:
 * live-preload.ts), 'shell' (the app shell, on every signed-in page), 'live' (the page itself). Left to the bundler,
 * these modules came as some thirty small chunks (one per set of pages sharing them), each a request ahead of the
 * page's answers (six at a time over HTTP/1.1). A page that shares a module with the live page now loads the live
 * page's file too (tens of kB gzip): the price of fewer files.
 */
function livePageGroups(): (id: string, ctx: Rolldown.ChunkingContext) => string | null {
  const src = (path: string) => fileURLToPath(new URL(path, import.meta.url));
  const groups: [name: string, roots: string[]][] = [
    ['live-data', [src('./src/features/runs/live/live-preload.ts')]],
    ['shell', [src('./src/components/AppShell/Shell.tsx')]],
    ['live', [src('./src/features/runs/live/LiveRun.page.tsx')]],
  ];
  let memo: Map<string, string> | undefined;
  return (id, ctx) => {
    if (!memo) {
      memo = new Map();
      const taken = new Set<string>();
      const reach = (roots: string[], name?: string) => {
        const todo = roots.filter((r) => ctx.getModuleInfo(r));
        while (todo.length) {
          const m = todo.pop()!;
          if (taken.has(m)) continue;
          taken.add(m);
          // The icons' own helpers stay out: the 'icons' chunk imports them, and a chunk importing its importer breaks.
          if (name && !/node_modules[\\/]@tabler[\\/]/.test(m)) memo!.set(m, name);
          todo.push(...(ctx.getModuleInfo(m)?.importedIds ?? []));
        }
      };
      reach([src('./src/main.tsx')]);
      // What the sign-in page shares with the shell stays out too, or the sign-in page would load the shell's file.
      reach([src('./src/features/auth/pages/SignIn.page.tsx')]);
      for (const [name, roots] of groups) reach(roots, name);
    }
    return memo.get(id) ?? null;
  };
}

export default defineConfig({
  plugins: [react(), outboxWorker(), pwa],
  server: {
    port: 5173,
    proxy: { '/api': 'http://127.0.0.1:3000', '/socket.io': { target: 'ws://127.0.0.1:3000', ws: true } },
  },
  build: {
    outDir: 'dist',
    sourcemap: false,
    chunkSizeWarningLimit: 900,
    rollupOptions: {
      output: {
        // Only what every page needs goes into 'vendor'; the rest (charts, dates, dropzone...) is left to the
        // bundler, which puts it beside the lazy pages that use it. A group also takes in the modules it imports: a
        // 'charts' chunk took React and Mantine with it, and the sign-in page then loaded the charts.
        // The icons, one small module each, go together into one 'icons' chunk (without what they import): a page
        // needs a dozen or more, and a file each cost a request (six at a time over HTTP/1.1, a round trip each on a
        // tablet's poor Wi-Fi), ahead of the page's own answers. All of them are about 6 kB gzip.
        codeSplitting: {
          groups: [
            {
              name: 'vendor',
              test: /node_modules\/(react|react-dom|scheduler|react-router|react-router-dom|@mantine\/core|@mantine\/hooks)\//,
              priority: 2,
            },
            {
              name: 'icons',
              test: /node_modules\/@tabler\/icons-react\/dist\/esm\/icons\//,
              priority: 1,
              includeDependenciesRecursively: false,
            },
            { name: livePageGroups(), includeDependenciesRecursively: false },
          ],
        },
      },
    },
  },
  test: {
    environment: 'jsdom',
    globals: true,
    setupFiles: ['./src/test-utils/setup.ts'],
    include: ['src/**/*.test.{ts,tsx}'],
    css: false,
  },
});
