import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router';
import { createQueryClient } from './lib/query-client';
import { prefetchFirstPins } from './features/map/first-pins';
import { createRouter } from './router';
import './index.css';

const queryClient = createQueryClient();
const router = createRouter();
prefetchFirstPins(queryClient);

// The service worker (vite-plugin-pwa, dist/sw.js) caches the app shell so the app opens with no
// signal; registered once the first screen has loaded, so its precaching never competes with it.
if (import.meta.env.PROD && 'serviceWorker' in navigator) {
  window.addEventListener('load', () => void navigator.serviceWorker.register('/sw.js').catch(() => undefined));
}

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  </StrictMode>,
);
