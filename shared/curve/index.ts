/** The curve engine: document, schema, slope rules, evaluation, segment math, shapes. */
export * from './types';
export { curveDocumentSchema, parseCurveDocument, curveJsonSchema, formatPath, type CurveIssue } from './schema';
export { resolveSlopes } from './slopes';
export {
  prepareCurve, hermitePower, type PreparedCurve,
  KIND_STEP, KIND_LINEAR, KIND_HERMITE, KIND_BEZIER, KIND_SHAPE,
} from './prepare';
export { findSegment } from './find';
export { evaluate, evaluateDerivative, evaluateMany } from './evaluate';
export { segmentValue, segmentPolynomial, segmentDerivativeBound } from './segment';
export { curveBreaks, type CurveBreak } from './breaks';
export {
  bezierSolve, bezierEase, bezierEaseBound, bernstein, bezierStartSlope, bezierEndSlope,
  BEZIER_MAX_ITERATIONS, BEZIER_TOLERANCE,
} from './bezier';
export { shapeValue, shapeDerivativeBound, shapeBreaks, shapeBreakDetails, SHAPE_DEFAULTS, type ShapeBreak } from './shapes';
