import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router';
import { createQueryClient } from './lib/query-client';
import { prefetchFirstPins } from './features/map/first-pins';
import { createRouter, preloadAtlasHome } from './router';
import './index.css';

const queryClient = createQueryClient();
const router = createRouter();
prefetchFirstPins(queryClient);

// The service worker (vite-plugin-pwa, dist/sw.js) caches the app shell so the app opens with no
// signal; registered once the first screen has loaded, so its precaching never competes with it.
if (import.meta.env.PROD && 'serviceWorker' in navigator) {
  window.addEventListener('load', () => void navigator.serviceWorker.register('/sw.js').catch(() => undefined));
}

function render() {
  createRoot(document.getElementById('root')!).render(
    <StrictMode>
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </StrictMode>,
  );
}

// On the atlas home its page's code is already on its way (preloaded): wait for it, a few ms, and the
// first frame is the page; if it fails, the page's own loading (and error) path takes over. (A
// top-level await here would make the bundler split the shell into many more files.)
if (window.location.pathname === '/') void preloadAtlasHome().then(render, render);
else render();
