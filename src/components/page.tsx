import type { ReactNode } from 'react';

/** A scrolling page with a readable measure, for everything that is not the map. */
export function Page({ title, intro, children, wide = false }: { title: string; intro?: ReactNode; children: ReactNode; wide?: boolean }) {
  return (
    <div className="h-full overflow-y-auto">
      <div className={`mx-auto px-4 py-8 ${wide ? 'max-w-6xl' : 'max-w-xl'}`}>
        <h1 className="text-2xl font-semibold tracking-tight text-fig-900">{title}</h1>
        {intro && <div className="mt-2 text-ink/80">{intro}</div>}
        <div className="mt-6">{children}</div>
      </div>
    </div>
  );
}
