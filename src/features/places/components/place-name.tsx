import { useQuery } from '@tanstack/react-query';
import { placeLabel, placeSearchQueries } from '../api';

/** The town a point is named by, or its coordinates while (or when) there is none. */
export function usePlaceName(point: { lat: number; lon: number } | null): { label: string; town: string | null } {
  const nearest = useQuery({ ...placeSearchQueries.nearest(point?.lat ?? 0, point?.lon ?? 0), enabled: !!point });
  if (!point) return { label: 'no place chosen', town: null };
  const coords = `${point.lat.toFixed(2)}, ${point.lon.toFixed(2)}`;
  const place = nearest.data?.place;
  return place ? { label: `near ${placeLabel(place)}`, town: placeLabel(place) } : { label: `at ${coords}`, town: null };
}
