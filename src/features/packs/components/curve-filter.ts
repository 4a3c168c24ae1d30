/** Which curve cards the pack page shows: name contains, tag, segment kind and what the curve drives. */
import type { CurveDocument, Drives, SegmentKind } from '../../../../shared/curve';

export interface CurveFilter {
  name: string;
  tag: string;
  kind: SegmentKind | '';
  drives: Drives | '';
}

export const NO_FILTER: CurveFilter = { name: '', tag: '', kind: '', drives: '' };

export function matchesFilter(doc: CurveDocument, f: CurveFilter): boolean {
  const name = f.name.trim().toLowerCase();
  if (name && !doc.name.toLowerCase().includes(name) && !(doc.description ?? '').toLowerCase().includes(name)) return false;
  if (f.tag && !doc.tags.includes(f.tag)) return false;
  if (f.kind && !doc.segments.some((s) => s.kind === f.kind)) return false;
  if (f.drives && doc.drives !== f.drives) return false;
  return true;
}

/** Every tag used by the curves, sorted, for the tag filter's choices. */
export function tagsOf(docs: readonly CurveDocument[]): string[] {
  return [...new Set(docs.flatMap((d) => d.tags))].sort();
}

/** The order after moving the item at `index` one place earlier (-1) or later (+1). */
export function moved<T>(items: readonly T[], index: number, by: -1 | 1): T[] {
  const j = index + by;
  if (index < 0 || index >= items.length || j < 0 || j >= items.length) return [...items];
  const out = [...items];
  [out[index], out[j]] = [out[j]!, out[index]!];
  return out;
}

/** The order after taking the item at `from` out and putting it where the item at `to` was (a drop). */
export function placed<T>(items: readonly T[], from: number, to: number): T[] {
  if (from < 0 || from >= items.length || to < 0 || to >= items.length || from === to) return [...items];
  const out = [...items];
  const [item] = out.splice(from, 1);
  out.splice(to, 0, item!);
  return out;
}
