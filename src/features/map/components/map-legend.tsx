import { useState } from 'react';
import { FROST_BANDS } from '../frost-bands';
import { MAP_COLORS as C } from '../palette';
import type { OverlayName } from '../url-state';
import { useUnits } from '../../units/use-units';

/**
 * What the marks on the map mean (the frost bands and wasp areas only when their layer is on), and
 * whose data the base map is drawn from. Folds away on a phone.
 */
export function MapLegend({ overlays, openAtStart }: { overlays: OverlayName[]; openAtStart: boolean }) {
  const units = useUnits();
  const [open, setOpen] = useState(openAtStart);
  return (
    <section aria-label="Map legend" className="pointer-events-auto max-w-[15rem] rounded-lg border border-fig-100 bg-paper/95 text-xs text-ink shadow-sm backdrop-blur">
      <button type="button" aria-expanded={open} onClick={() => setOpen(!open)} className="flex w-full items-center justify-between gap-3 px-3 py-1.5 font-medium text-fig-700">
        Legend
        <span aria-hidden className="text-ink/70">
          {open ? '−' : '+'}
        </span>
      </button>
      {open && (
        <div className="px-3 pb-2">
          <ul className="flex flex-col gap-1.5">
            <li className="flex items-center gap-2">
              <span className="grid h-5 w-5 shrink-0 place-items-center rounded-full border-2 text-[9px] font-medium text-white" style={{ background: C.fig600, borderColor: C.paper }} aria-hidden>
                12
              </span>
              A group of reports; click to zoom in
            </li>
            <li className="flex items-center gap-2">
              <span className="ml-0.5 inline-block h-3.5 w-3.5 shrink-0 rounded-full border-2" style={{ background: C.fig500, borderColor: C.paper }} aria-hidden />
              <span className="ml-0.5">Reports on one ~5 km cell</span>
            </li>
            {overlays.includes('wasp') && (
              <li className="flex items-center gap-2">
                <span className="inline-block h-3.5 w-5 shrink-0 rounded-sm border border-dashed" style={{ background: 'rgba(94,138,87,0.18)', borderColor: C.leaf700 }} aria-hidden />
                Fig wasp established
              </li>
            )}
          </ul>
          {overlays.includes('frost') && (
            <div className="mt-2 border-t border-fig-100 pt-2">
              <p className="font-medium">Frost-free days ({units.temperature(32)}, half the years)</p>
              <ul className="mt-1 grid grid-cols-1 gap-0.5">
                {FROST_BANDS.map((b) => (
                  <li key={b.from} className="flex items-center gap-2">
                    <span className="inline-block h-3 w-3 rounded-full border border-ink/30" style={{ background: b.color }} aria-hidden />
                    {b.label}
                  </li>
                ))}
              </ul>
            </div>
          )}
          <p className="mt-2 text-[11px] leading-snug text-ink/70">Pins sit on a coarse grid to keep growers’ gardens private.</p>
          <p className="mt-1 text-[10px] leading-snug text-ink/70">Map data: Natural Earth, US Census Bureau, GeoNames (CC BY).</p>
        </div>
      )}
    </section>
  );
}
