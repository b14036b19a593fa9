import { lazy, Suspense, type ComponentType } from 'react';

/** Shown in the page's place while its chunk arrives (a slow phone network: a second or two). */
function PageLoading() {
  return (
    <p role="status" className="p-6 text-sm text-ink/60">
      Loading…
    </p>
  );
}

/**
 * A page loaded on first use (React.lazy), in its own Suspense boundary so the app shell around it
 * paints at once and keeps its header while the page's code is on its way.
 */
export function lazyPage(load: () => Promise<{ default: ComponentType }>) {
  const Page = lazy(load);
  return function LazyPage() {
    return (
      <Suspense fallback={<PageLoading />}>
        <Page />
      </Suspense>
    );
  };
}
