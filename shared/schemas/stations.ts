import { z } from 'zod';

/** A climate station in lists and on the map's frost-free season layer. */
export const stationListItemSchema = z.object({
  id: z.number().int(),
  code: z.string().nullable(),
  name: z.string(),
  lat: z.number(),
  lon: z.number(),
  elevationM: z.number().nullable(),
  firstDate: z.string().nullable(),
  lastDate: z.string().nullable(),
  dayCount: z.number().int(),
  /** Frost-free days at 32 deg F not exceeded in half the years; null until computed or when unknown. */
  days50: z.number().nullable(),
});
export type StationListItem = z.infer<typeof stationListItemSchema>;

/** GET /api/stations (public). */
export const stationListSchema = z.object({ stations: z.array(stationListItemSchema) });
