/** Conversions: glTF 2.0 animation import/export, CSS easing functions, key reduction, motion samples. */
export { writeGltf, writeGlb, type GltfTrack, type GltfInterpolation, type GltfWriteOptions, type GltfWritten, type GltfJson } from './gltf-write';
export { readGltf, parseGlb, isGlb, GltfReadError, type GltfImport, type GltfResolver } from './gltf-read';
export { exportGltf, evaluateGltfTrack, gltfNodeName, type GltfExport, type GltfExportOptions, type GltfTrackReport } from './gltf-export';
export {
  parseCssEasing, evaluateCssEasing, formatCssEasing, canonicalizeLinear, cubicBezierEasing, stepsEasing, linearEasing,
  CSS_BEZIER_KEYWORDS, type CssEasing, type CssParseResult, type LinearPoint, type StepPosition,
} from './css-easing';
export { cssToCurve, curveToCss, type CurveToCssResult, type SlopeSource } from './css-curve';
export { fitSamples, leastSquaresHermite, type FitKey, type FitResult, type FitOptions } from './fit';
export { fitCurve, fitResultToCurve, type FitCurveResult } from './fit-curve';
export { parseSamples, parseSamplesCsv, parseSamplesJson, type Samples, type SamplesResult } from './samples';
export { encodeBase64, decodeBase64 } from './base64';
export { encodeUtf8, decodeUtf8 } from './utf8';
