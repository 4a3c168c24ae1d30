/**
 * JSON output: {"curves":[{"name","kernel","layout","encoding","times","values","slopesIn","slopesOut",
 * "bytes","bound","maxError"}]} with times, values and slopes exactly as the runtime decodes them
 * (slope arrays empty for the linear kernel), `bound` the a-priori bound (null where none applies) and
 * `maxError` the certified error. A curve that failed appears as {"name","error"}.
 */
import type { CurveBake } from '../bake';
import { logicalEntries } from './entries';

export type JsonCurve =
  | {
    name: string; kernel: string; layout: string; encoding: string;
    times: number[]; values: number[]; slopesIn: number[]; slopesOut: number[];
    bytes: number; bound: number | null; maxError: number;
  }
  | { name: string; error: string };

export function bakeToJson(b: CurveBake): JsonCurve {
  if (!b.ok) return { name: b.name, error: b.error };
  const e = logicalEntries(b.table);
  return {
    name: b.name, kernel: b.table.kernel, layout: b.table.layout, encoding: b.table.encoding,
    times: e.times, values: e.values, slopesIn: e.slopesIn, slopesOut: e.slopesOut,
    bytes: b.report.bytes, bound: b.report.bound, maxError: b.report.certified,
  };
}

export function writeJson(bakes: readonly CurveBake[]): string {
  return JSON.stringify({ curves: bakes.map(bakeToJson) });
}
