/** The baker's public API: profiles, baking with its report, error measurement, and the outputs. */
export { ProfileSchema, parseProfile, DEMO_PROFILES, KERNELS, LAYOUTS, ENCODINGS, type Profile, type ProfileInput, type Kernel, type Layout, type Encoding } from './profile';
export { bakeCurve, bakePack, absoluteTolerance, roundOffBound, type CurveBake, type CurveReport, type PackBake, type PackTotals, type BakeOptions } from './bake';
export { measureError, type ErrorMeasure, type Method } from './measure';
export { evalTable, type Table } from './table';
export { interpolationBound, widthForTolerance, aprioriBound } from './bound';
export { roundF16, f16Bits, f16FromBits } from './f16';
export { crc32 } from './crc32';
export { makeQuantizer, encodeArray, roundTrip } from './encoding';
export type { BakeSource } from './source';
export * from './outputs';
export { sourceFromPrepared, sourceFromDocument } from './from-curve';
