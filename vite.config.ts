import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import path from 'node:path';
import type { Plugin } from 'vite';
import { compression } from 'vite-plugin-compression2';

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
        const files = new Set<string>();
        const visit = (file: string) => {
          const chunk = bundle[file];
          if (!chunk || chunk.type !== 'chunk' || files.has(file)) return;
          files.add(file);
          chunk.imports.forEach(visit);
        };
        visit(home.fileName);
        const entry = chunks.find((c) => c.isEntry);
        const alreadyPreloaded = new Set([entry?.fileName, ...(entry?.imports ?? [])]);
        const cssOf = (file: string | undefined) => [...((file && (bundle[file] as { viteMetadata?: { importedCss: Set<string> } }).viteMetadata?.importedCss) || [])];
        const entryCss = new Set(cssOf(entry?.fileName));
        const css = [...files].flatMap(cssOf).filter((file) => !entryCss.has(file));
        return [
          ...[...files].filter((file) => !alreadyPreloaded.has(file)).map((file) => ({ tag: 'link', attrs: { rel: 'modulepreload', crossorigin: true, href: `/${file}` }, injectTo: 'head' as const })),
          ...css.map((file) => ({ tag: 'link', attrs: { rel: 'preload', as: 'style', crossorigin: true, href: `/${file}` }, injectTo: 'head' as const })),
        ];
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
    // Brotli and gzip copies of every text asset at build time; the server sends the one the browser takes.
    compression({ algorithms: ['brotliCompress', 'gzip'], include: /\.(html|css|js|mjs|svg|json|webmanifest)$/, threshold: 1024 }),
  ],
  resolve: {
    alias: { '@shared': path.resolve(import.meta.dirname, 'shared') },
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
    chunkSizeWarningLimit: 1100,
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
