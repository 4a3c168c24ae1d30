/**
 * Curves from outside the editor: dense motion samples (CSV or JSON text, shared/convert parseSamples)
 * reduced to hermite keys within a chosen tolerance (shared/convert fitSamples), and a pasted CSS
 * easing function (shared/convert parseCssEasing → cssToCurve). The current curve's name, units, what
 * it drives, tags and frame rate are kept, so an import replaces the shape, not the curve's identity.
 * Every failure names the line, the field or the character position.
 */
import { cssToCurve, fitResultToCurve, fitSamples, parseCssEasing, parseSamples } from '../../../../shared/convert';
import { parseCurveDocument, type CurveDocument } from '../../../../shared/curve';

export type SamplesImport =
  | { ok: true; doc: CurveDocument; samples: number; keys: number; maxError: number; tolerance: number; withinTolerance: boolean }
  | { ok: false; error: string };

export type CssImport = { ok: true; doc: CurveDocument; keys: number; easing: string } | { ok: false; error: string };

type Identity = Pick<CurveDocument, 'name' | 'units' | 'drives' | 'tags' | 'frameRate'> & { description?: string };
const identity = (d: CurveDocument): Identity => ({
  name: d.name, units: d.units, drives: d.drives, tags: d.tags, frameRate: d.frameRate,
  ...(d.description !== undefined ? { description: d.description } : {}),
});

/** Validated by the shared schema, so an import never puts an invalid document into the editor. */
function checked(doc: CurveDocument, what: string): { ok: true; doc: CurveDocument } | { ok: false; error: string } {
  const r = parseCurveDocument(doc);
  return r.ok ? { ok: true, doc: r.doc } : { ok: false, error: `${what}: the result is not a valid curve (${r.issues[0]?.message ?? 'no detail'})` };
}

/** Parse the tolerance field: a positive finite number in the curve's value units. */
export function parseTolerance(text: string): { ok: true; value: number } | { ok: false; error: string } {
  const v = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(v) || !(v > 0)) return { ok: false, error: `tolerance: must be a positive number, got "${text}"` };
  return { ok: true, value: v };
}

export function importSamples(text: string, tolerance: number, current: CurveDocument): SamplesImport {
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) return { ok: false, error: `tolerance: must be a positive number, got ${tolerance}` };
  const parsed = parseSamples(text);
  if (!parsed.ok) return { ok: false, error: `samples: ${parsed.error}` };
  const { times, values } = parsed.samples;
  const fit = fitSamples(times, values, tolerance);
  const id = identity(current);
  const c = checked({ ...fitResultToCurve(fit, id), before: current.before, after: current.after }, 'samples');
  if (!c.ok) return c;
  return { ok: true, doc: c.doc, samples: times.length, keys: fit.keys.length, maxError: fit.maxError, tolerance, withinTolerance: fit.ok };
}

export function importCssEasing(text: string, current: CurveDocument): CssImport {
  const r = parseCssEasing(text.trim());
  if (!r.ok) return { ok: false, error: r.error };
  const fromCss = cssToCurve(r.easing);
  // the easing's own domain [0, 1], what happens outside it and its segments; the curve's identity
  const id = identity(current);
  const c = checked({ ...fromCss, ...id, units: { time: fromCss.units.time, value: current.units.value } }, 'CSS easing');
  if (!c.ok) return c;
  return { ok: true, doc: c.doc, keys: c.doc.keys.length, easing: text.trim() };
}
