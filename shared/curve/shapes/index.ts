export { shapeValue, shapeDerivativeBound, shapeBreaks, shapeBreakDetails, FAMILIES } from './compose';
export type { ShapeBreak, EaseFamily, ShapeParams } from './family';
export { DEFAULTS as SHAPE_DEFAULTS } from './family';
