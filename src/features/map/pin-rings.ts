import type { ExpressionSpecification, Map as MapLibreMap } from 'maplibre-gl';
import { MAP_COLORS as C } from './palette';

/*
 * A pin is a ring that answers "how did these reports turn out?": clockwise from the top, the share
 * that ripened (deep fig), the share still unripe at season's end (amber), and the rest, dropped or
 * bearing nothing (pale). The three differ first in lightness, so they read apart with any colour
 * vision, and in print. Ring images are drawn on demand, one per rounded pair of shares.
 */

export const OUTCOME_RING_COLORS = { ripened: '#4b2443', unripe: '#c98a2b', other: '#e8e1e5' } as const;
/** Shares are rounded to 24ths of the ring (15 degrees): fine enough to compare neighbours. */
export const RING_STEPS = 24;
const RING_PREFIX = 'syconium-ring-';
const PIXEL_RATIO = 2;
/** The ring image's side in screen pixels at icon-size 1. */
export const RING_SIZE_PX = 30;

const share = (field: 'ripened' | 'unripe'): ExpressionSpecification => ['round', ['*', RING_STEPS, ['/', ['get', field], ['max', 1, ['get', 'reports']]]]];

/** The ring image of a pin feature (with `reports`, `ripened` and `unripe`). */
export const RING_IMAGE: ExpressionSpecification = ['concat', RING_PREFIX, ['to-string', share('ripened')], '-', ['to-string', share('unripe')]];

/** The rounded steps of each part of the ring, ripened first, as drawn. */
export function ringSteps(reports: number, ripened: number, unripe: number): { ripened: number; unripe: number; other: number } {
  const r = Math.round((RING_STEPS * ripened) / Math.max(1, reports));
  const u = Math.min(RING_STEPS - r, Math.round((RING_STEPS * unripe) / Math.max(1, reports)));
  return { ripened: r, unripe: u, other: RING_STEPS - r - u };
}

/** Draws a ring into a 2D context of `size` pixels. */
export function paintRing(g: CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D, size: number, steps: { ripened: number; unripe: number; other: number }): void {
  const c = size / 2;
  const outer = c - size * 0.04;
  const inner = outer * 0.6;
  g.clearRect(0, 0, size, size);
  g.beginPath();
  g.arc(c, c, c - 0.5, 0, 2 * Math.PI);
  g.fillStyle = C.paper;
  g.fill();
  let angle = -Math.PI / 2;
  const parts: [number, string][] = [
    [steps.ripened, OUTCOME_RING_COLORS.ripened],
    [steps.unripe, OUTCOME_RING_COLORS.unripe],
    [steps.other, OUTCOME_RING_COLORS.other],
  ];
  for (const [n, color] of parts) {
    if (n <= 0) continue;
    const end = angle + (n / RING_STEPS) * 2 * Math.PI;
    g.beginPath();
    g.moveTo(c, c);
    g.arc(c, c, outer, angle, end);
    g.closePath();
    g.fillStyle = color;
    g.fill();
    // A thin paper gap between parts keeps their edges visible where two colours are close.
    if (n < RING_STEPS) {
      g.beginPath();
      g.moveTo(c, c);
      g.lineTo(c + outer * Math.cos(end), c + outer * Math.sin(end));
      g.strokeStyle = C.paper;
      g.lineWidth = size * 0.035;
      g.stroke();
    }
    angle = end;
  }
  g.beginPath();
  g.arc(c, c, inner, 0, 2 * Math.PI);
  g.fillStyle = C.paper;
  g.fill();
  g.beginPath();
  g.arc(c, c, outer, 0, 2 * Math.PI);
  g.strokeStyle = 'rgba(43,34,48,0.35)';
  g.lineWidth = size * 0.02;
  g.stroke();
}

/** Supplies ring images as MapLibre asks for them (MapLibre 6: a missing-image resolver; the event comes too late). */
export function provideRingImages(map: MapLibreMap): void {
  map.setMissingStyleImageResolver((id) => {
    if (!id.startsWith(RING_PREFIX) || map.hasImage(id)) return;
    const [r, u] = id.slice(RING_PREFIX.length).split('-').map(Number);
    if (!Number.isInteger(r) || !Number.isInteger(u)) return;
    const size = RING_SIZE_PX * PIXEL_RATIO;
    const canvas = document.createElement('canvas');
    canvas.width = canvas.height = size;
    const g = canvas.getContext('2d');
    if (!g) return;
    const ripened = Math.max(0, Math.min(RING_STEPS, r!));
    const unripe = Math.max(0, Math.min(RING_STEPS - ripened, u!));
    paintRing(g, size, { ripened, unripe, other: RING_STEPS - ripened - unripe });
    map.addImage(id, g.getImageData(0, 0, size, size), { pixelRatio: PIXEL_RATIO });
  });
}
