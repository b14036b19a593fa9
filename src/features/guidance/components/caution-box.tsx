import type { ReactNode } from 'react';

export type CautionKind = 'latex' | 'spray' | 'ladder';

/** The usual cautions, in our words. Advice that can hurt always shows the matching one. */
export const CAUTIONS: Record<CautionKind, { title: string; text: string }> = {
  latex: {
    title: 'Fig sap irritates skin',
    text: 'The milky latex that runs from cut shoots and leaves irritates skin and can burn it in sunlight. Wear gloves and long sleeves when pinching or pruning, and wash any sap off with soap and water straight away.',
  },
  spray: {
    title: 'Fertilisers and sprays',
    text: 'Follow the product label exactly, and the rules where you live; your local extension service can say what is suitable and safe for your area.',
  },
  ladder: {
    title: 'Ladder work',
    text: 'Work from a stable ladder on firm ground with someone nearby, and follow the ladder’s instructions and local safety rules; leave tall trees to a professional.',
  },
};

/** A calm, visible box with one or more cautions. */
export function CautionBox({ kinds, children }: { kinds: CautionKind[]; children?: ReactNode }) {
  if (kinds.length === 0 && !children) return null;
  return (
    <aside role="note" aria-label="Caution" className="rounded-lg border border-amber-soft bg-amber-soft/30 px-4 py-3 text-sm text-ink">
      <p className="font-medium text-fig-900">
        <span aria-hidden="true">⚠ </span>Take care
      </p>
      <ul className="mt-1 flex flex-col gap-1">
        {kinds.map((kind) => (
          <li key={kind}>
            <strong className="font-medium">{CAUTIONS[kind].title}.</strong> {CAUTIONS[kind].text}
          </li>
        ))}
      </ul>
      {children}
    </aside>
  );
}
