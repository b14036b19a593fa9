import type { ExpressionSpecification } from 'maplibre-gl';
import { MAP_COLORS as C } from './palette';

/*
 * How a fig-wasp area looks on every map (the atlas, What ripens here, the editors' map): an active
 * area is a leaf-green wash inside a solid outline; a retired one (editors only) a grey wash inside
 * a dashed outline. Features without a status are active (the public list holds only those).
 */
const retired: ExpressionSpecification = ['==', ['get', 'status'], 'retired'];

export const WASP_FILL_PAINT = {
  'fill-color': ['case', retired, '#9a8f96', C.leaf500] as ExpressionSpecification,
  'fill-opacity': ['case', retired, 0.1, ['boolean', ['get', 'selected'], false], 0.4, 0.2] as ExpressionSpecification,
};

export const WASP_LINE_PAINT = {
  'line-color': ['case', retired, '#7d7378', C.leaf700] as ExpressionSpecification,
  'line-width': ['case', ['boolean', ['get', 'selected'], false], 3, 1.6] as ExpressionSpecification,
  'line-dasharray': ['case', retired, ['literal', [2, 2]], ['literal', [1, 0]]] as ExpressionSpecification,
};
