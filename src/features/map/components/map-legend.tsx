import { useState } from 'react';
import { OUTCOME_RING_COLORS } from '../pin-rings';
import { MAP_COLORS as C, SEASON_RAMP } from '../palette';
import type { OverlayName } from '../url-state';
import { useUnits } from '../../units/use-units';
import { OutcomeRing } from './outcome-ring';

const RAMP_GRADIENT = `linear-gradient(to right, ${SEASON_RAMP.map((s, i) => `${s.color} ${Math.round((i / (SEASON_RAMP.length - 1)) * 100)}%`).join(', ')})`;

/**
 * What the marks on the map mean (the season surface and wasp areas only when their layer is on),
 * and whose data the base map is drawn from. Folds away on a phone.
 */
export function MapLegend({ overlays, openAtStart }: { overlays: OverlayName[]; openAtStart: boolean }) {
  const units = useUnits();
  const [open, setOpen] = useState(openAtStart);
  return (
    <section aria-label="Map legend" className="pointer-events-auto max-h-[calc(100dvh-12rem)] max-w-[16rem] overflow-y-auto rounded-lg border border-fig-100 bg-paper/95 text-xs text-ink shadow-sm backdrop-blur">
      <button type="button" aria-expanded={open} onClick={() => setOpen(!open)} className="flex w-full items-center justify-between gap-3 px-3 py-1.5 font-medium text-fig-700">
        Legend
        <span aria-hidden className="text-ink/70">
          {open ? '−' : '+'}
        </span>
      </button>
      {open && (
        <div className="px-3 pb-2">
          <div className="flex items-start gap-2">
            <OutcomeRing steps={{ ripened: 14, unripe: 6, other: 4 }} size={30} />
            <div>
              <p className="font-medium">How the reports turned out</p>
              <ul className="mt-0.5 flex flex-col gap-0.5">
                <li className="flex items-center gap-1.5">
                  <span className="inline-block h-2.5 w-2.5 rounded-sm" style={{ background: OUTCOME_RING_COLORS.ripened }} aria-hidden />
                  ripened (dark)
                </li>
                <li className="flex items-center gap-1.5">
                  <span className="inline-block h-2.5 w-2.5 rounded-sm" style={{ background: OUTCOME_RING_COLORS.unripe }} aria-hidden />
                  still unripe at season’s end
                </li>
                <li className="flex items-center gap-1.5">
                  <span className="inline-block h-2.5 w-2.5 rounded-sm border border-ink/20" style={{ background: OUTCOME_RING_COLORS.other }} aria-hidden />
                  dropped or no fruit (pale)
                </li>
              </ul>
            </div>
          </div>
          <p className="mt-1.5 text-[11px] leading-snug text-ink/75">
            Clockwise from the top, under the filters you chose. The number is how many reports; a large ring groups nearby cells (click to zoom in), a small one is a single ~5 km cell.
          </p>
          {overlays.includes('wasp') && (
            <p className="mt-2 flex items-center gap-2">
              <span className="inline-block h-3.5 w-5 shrink-0 rounded-sm border-[1.5px]" style={{ background: 'rgba(94,138,87,0.2)', borderColor: C.leaf700 }} aria-hidden />
              Fig wasp established
            </p>
          )}
          {overlays.includes('frost') && (
            <div className="mt-2 border-t border-fig-100 pt-2">
              <p className="font-medium">Frost-free days ({units.temperature(32)}, half the years)</p>
              <div className="mt-1 h-3 rounded-sm border border-ink/15" style={{ background: RAMP_GRADIENT }} aria-hidden />
              <div className="mt-0.5 flex justify-between text-[10px] text-ink/75">
                <span>{SEASON_RAMP[0]!.days} or fewer</span>
                <span>{SEASON_RAMP[3]!.days}</span>
                <span>{SEASON_RAMP[SEASON_RAMP.length - 1]!.days}+</span>
              </div>
              <p className="mt-1 flex items-center gap-2 text-[11px] leading-snug text-ink/75">
                <span
                  className="inline-block h-3.5 w-5 shrink-0 rounded-sm border border-ink/15"
                  style={{ background: `repeating-linear-gradient(135deg, rgba(91,79,94,0.55) 0 1.5px, rgba(179,208,166,0.45) 1.5px 5px)` }}
                  aria-hidden
                />
                Faded or hatched: few stations, or the nearest far away. Click the map to read the value and its stations.
              </p>
              <p className="mt-1 flex items-center gap-2 text-[11px] text-ink/75">
                <span className="inline-block h-2.5 w-2.5 rounded-full border-[1.5px] border-ink/70 bg-paper" aria-hidden />
                A climate station
              </p>
            </div>
          )}
          <p className="mt-2 text-[10px] leading-snug text-ink/70">
            Map data: Natural Earth, US Census Bureau, GeoNames (CC BY), lakes and rivers © OpenStreetMap contributors (ODbL) via geo-maps.
          </p>
        </div>
      )}
    </section>
  );
}
