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
 * paints at once and keeps its header while the page's code is on its way. `preload()` fetches it
 * ahead: a page already loaded is drawn at once, without a "Loading…" frame first (React.lazy
 * suspends once even for a module that has arrived). Its module is known before the lazy component
 * resolves, so a mounted page is always the loaded component and never remounts.
 */
export function lazyPage(load: () => Promise<{ default: ComponentType }>) {
  let Loaded: ComponentType | null = null;
  const preload = () =>
    load().then((module) => {
      Loaded = module.default;
      return module;
    });
  const Lazy = lazy(preload);
  function Page() {
    return Loaded ? <Loaded /> : <Lazy />;
  }
  function LazyPage() {
    return (
      <Suspense fallback={<PageLoading />}>
        <Page />
      </Suspense>
    );
  }
  return Object.assign(LazyPage, { preload });
}
