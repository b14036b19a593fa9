import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import path from 'node:path';
import { build, type Plugin } from 'vite';
import { compression } from 'vite-plugin-compression2';
import { VitePWA } from 'vite-plugin-pwa';

/**
 * The atlas is the first screen of most visits: preload its page chunk and everything it imports
 * (MapLibre is most of it) from index.html, so it downloads alongside the shell instead of after it.
 * Vite already preloads the entry's own imports; this adds the lazily loaded home page's.
 */
function preloadAtlas(): Plugin {
  return {
    name: 'syconium-preload-atlas',
    apply: 'build',
    enforce: 'post',
    transformIndexHtml: {
      order: 'post',
      handler(_html, { bundle }) {
        if (!bundle) return [];
        const chunks = Object.values(bundle).filter((c) => c.type === 'chunk');
        const home = chunks.find((c) => c.facadeModuleId?.endsWith('/src/routes/home.tsx'));
        if (!home) return [];
        /** A chunk and every chunk it imports statically, transitively. */
        const staticallyReached = (start: string | undefined) => {
          const reached = new Set<string>();
          const visit = (file: string) => {
            const chunk = bundle[file];
            if (!chunk || chunk.type !== 'chunk' || reached.has(file)) return;
            reached.add(file);
            chunk.imports.forEach(visit);
          };
          if (start) visit(start);
          return reached;
        };
        // Static imports only: the map (MapLibre) is a dynamic import of the page, fetched once it runs,
        // so the page's own small code is not slowed by sharing the link with 390 KB of map.
        const files = staticallyReached(home.fileName);
        const entry = chunks.find((c) => c.isEntry);
        // Vite preloads what the entry reaches statically.
        const alreadyPreloaded = staticallyReached(entry?.fileName);
        const cssOf = (file: string | undefined) => [...((file && (bundle[file] as { viteMetadata?: { importedCss: Set<string> } }).viteMetadata?.importedCss) || [])];
        const entryCss = new Set(cssOf(entry?.fileName));
        const css = [...files].flatMap(cssOf).filter((file) => !entryCss.has(file));
        // The body text's font (Latin 400), needed by the first paint's text.
        const font = Object.values(bundle)
          .map((item) => item.fileName)
          .find((file) => /fira-sans-latin-400-normal-[\w-]+\.woff2$/.test(file));
        return [
          ...(font ? [{ tag: 'link', attrs: { rel: 'preload', as: 'font', type: 'font/woff2', crossorigin: true, href: `/${font}` }, injectTo: 'head' as const }] : []),
          ...[...files].filter((file) => !alreadyPreloaded.has(file)).map((file) => ({ tag: 'link', attrs: { rel: 'modulepreload', crossorigin: true, href: `/${file}` }, injectTo: 'head' as const })),
          ...css.map((file) => ({ tag: 'link', attrs: { rel: 'preload', as: 'style', crossorigin: true, href: `/${file}` }, injectTo: 'head' as const })),
        ];
      },
    },
  };
}

/** `@shared/...` imports: the app's and the early pins script's builds resolve them alike. */
const ALIASES = { '@shared': path.resolve(import.meta.dirname, 'shared') };

const EARLY_PINS_ENTRY = path.resolve(import.meta.dirname, 'src/features/map/early-pins.ts');

/** The inline script's text and the source files it is built from. */
export interface EarlyPinsScript {
  code: string;
  modules: string[];
}

/**
 * src/features/map/early-pins.ts (with what it imports: first-view.ts, url-state.ts, pins-url.ts)
 * bundled into one minified classic script (an IIFE), ready to write inside <script> in index.html.
 */
export async function buildEarlyPinsScript(): Promise<EarlyPinsScript> {
  const result = await build({
    configFile: false,
    envFile: false,
    logLevel: 'silent',
    publicDir: false,
    root: import.meta.dirname,
    resolve: { alias: ALIASES },
    build: { write: false, minify: true, lib: { entry: EARLY_PINS_ENTRY, formats: ['iife'], name: 'syconiumEarlyPins' } },
  });
  const chunk = (Array.isArray(result) ? result : [result]).flatMap((r) => ('output' in r ? r.output : [])).find((o) => o.type === 'chunk');
  if (!chunk) throw new Error('early-pins.ts gave no script');
  const code = chunk.code.trim();
  if (/<\/script/i.test(code)) throw new Error('early-pins.ts must not contain "</script"');
  return { code, modules: Object.keys(chunk.modules) };
}

/**
 * The atlas home's first pins are asked for by an inline script in index.html's <head>, as soon as
 * the page is parsed, not after the app's JavaScript (~100 KB on a phone's signal) has arrived.
 * The script is built from the same TypeScript the app uses for that request, so the two agree;
 * the server allows it by its SHA-256 in the Content-Security-Policy (server/client/inline-scripts.ts),
 * never by 'unsafe-inline'. In build and dev alike (dev: built once, again after an edit to its sources).
 */
export function earlyPinsScript(): Plugin {
  let built: Promise<EarlyPinsScript> | null = null;
  return {
    name: 'syconium-early-pins',
    configureServer(server) {
      server.watcher.on('change', (file) => {
        void built?.then(({ modules }) => {
          if (modules.includes(path.resolve(file))) built = null;
        });
      });
    },
    transformIndexHtml: {
      order: 'pre',
      async handler() {
        built ??= buildEarlyPinsScript().catch((error: unknown) => {
          built = null;
          throw error;
        });
        const { code } = await built;
        // After the viewport <meta>: the script reads the window's size as the page will lay it out.
        return [{ tag: 'script', children: code, injectTo: 'head' }];
      },
    },
  };
}

const apiPort = Number(process.env.PORT ?? 3030);

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    preloadAtlas(),
    earlyPinsScript(),
    // Installable, with the app shell cached by a Workbox service worker: the pages open with no signal,
    // and the report form keeps what is written offline in IndexedDB (src/features/report-outbox/).
    VitePWA({
      registerType: 'autoUpdate',
      // Registered by src/main.tsx after the page has loaded (a script in <head> would cost a round trip before first paint).
      injectRegister: false,
      manifest: {
        name: 'Syconium · fig ripening atlas',
        short_name: 'Syconium',
        description: 'Which fig varieties ripen where you live, from growers’ own harvest reports.',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        background_color: '#faf6ef',
        theme_color: '#552c48',
        icons: [
          { src: '/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
        ],
      },
      workbox: {
        // The shell and every page chunk (MapLibre's worker included), the Latin fonts; not the
        // precompressed copies (the server picks those) nor the older woff files.
        globPatterns: ['**/*.{js,mjs,css,html,svg,png,webmanifest}', 'assets/fira-sans-latin-*.woff2'],
        maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//, /^\/tiles\//, /^\/uploads\//, /^\/metrics/],
        // Base map tiles already seen stay usable offline (the map opens where the grower last looked).
        runtimeCaching: [
          {
            urlPattern: ({ url }) => url.pathname.startsWith('/tiles/'),
            handler: 'StaleWhileRevalidate',
            options: { cacheName: 'syconium-tiles', expiration: { maxEntries: 600 } },
          },
        ],
      },
    }),
    // Brotli and gzip copies of every text asset at build time; the server sends the one the browser takes.
    compression({ algorithms: ['brotliCompress', 'gzip'], include: /\.(html|css|js|mjs|svg|json|webmanifest)$/, threshold: 1024 }),
  ],
  resolve: {
    alias: ALIASES,
  },
  server: {
    proxy: {
      '/api': `http://127.0.0.1:${apiPort}`,
      '/tiles': `http://127.0.0.1:${apiPort}`,
      '/uploads': `http://127.0.0.1:${apiPort}`,
    },
  },
  build: {
    outDir: 'dist',
    // MapLibre alone is 1.12 MB minified (250 KB sent); it loads only with a map, never for the first paint.
    chunkSizeWarningLimit: 1200,
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'node',
          include: ['tests/shared/**/*.test.ts', 'tests/server/**/*.test.ts', 'tests/scripts/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          name: 'client',
          include: ['tests/client/**/*.test.{ts,tsx}'],
          environment: 'happy-dom',
          setupFiles: ['tests/client/setup.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/e2e/global-setup.ts'],
          testTimeout: 90_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
