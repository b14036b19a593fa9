/**
 * The open-data licence of the atlas's published reports, stated once: sign-up asks growers to agree
 * to it, every export carries it, and the About page states it. Creative Commons Attribution 4.0
 * International (https://creativecommons.org/licenses/by/4.0/): anyone may share and adapt the data,
 * crediting the source.
 */
export const DATA_LICENCE = {
  name: 'CC BY 4.0',
  title: 'Creative Commons Attribution 4.0 International',
  url: 'https://creativecommons.org/licenses/by/4.0/',
  attribution: 'Syconium contributors',
} as const;

/** One line for an export's header or companion text. */
export const DATA_LICENCE_NOTICE = `Published harvest reports from Syconium by ${DATA_LICENCE.attribution}, shared under ${DATA_LICENCE.title} (${DATA_LICENCE.name}, ${DATA_LICENCE.url}). Credit "${DATA_LICENCE.attribution}" when you use them. Places are 5 km grid cells, never a grower's exact spot.`;
