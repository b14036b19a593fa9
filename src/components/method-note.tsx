import type { ReactNode } from 'react';

/**
 * What a figure rests on, in plain words, with the exact method (weights, intervals, estimators)
 * one click away for those who want it, instead of a paragraph of statistics under every number.
 */
export function MethodNote({ children, method, className = '' }: { children: ReactNode; method: ReactNode; className?: string }) {
  return (
    <div className={`text-xs text-ink/70 ${className}`}>
      <p>{children}</p>
      <details className="mt-1">
        <summary className="cursor-pointer font-medium text-fig-700 hover:underline">How this is worked out</summary>
        <div className="mt-1 max-w-prose">{method}</div>
      </details>
    </div>
  );
}
