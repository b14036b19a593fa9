import { LABELS, type GrowingForm } from '@shared/domain/codes';
import { usePlaceName } from '../../places/components/place-name';
import { useUnits } from '../../units/use-units';

/** The phone's compact control above the answer: where, how grown and how far, and a button to change them. */
export function PlaceBar({ point, form, radiusKm, open, onToggle }: { point: { lat: number; lon: number }; form: GrowingForm; radiusKm: number; open: boolean; onToggle: () => void }) {
  const place = usePlaceName(point);
  const units = useUnits();
  return (
    <div className="mb-4 flex items-center justify-between gap-3 rounded-lg border border-fig-100 bg-white px-3 py-2 text-sm lg:hidden" data-testid="place-bar">
      <p className="min-w-0">
        <span className="font-medium">{place.town ?? place.label}</span>
        <span className="text-ink/70">
          {' '}
          · {LABELS.growingForm[form]} · within {units.distance(radiusKm)}
        </span>
      </p>
      <button type="button" className="shrink-0 rounded-md border border-fig-200 px-3 py-1 font-medium text-fig-700" aria-expanded={open} aria-controls="place-picker" onClick={onToggle}>
        {open ? 'Done' : 'Change'}
      </button>
    </div>
  );
}
