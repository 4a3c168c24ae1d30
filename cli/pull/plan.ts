/**
 * Pure decisions of a pull: which artifacts of the manifest were asked for, and for each whether it must be
 * requested (and with which If-None-Match) or is already on disk with the manifest's SHA-256.
 */
import type { ManifestDto } from '../../shared/schemas/api-v1';
import { EXIT, PullError } from './exit-codes';
import { STATE_FILE } from './state';

export interface PlannedFile {
  target: string;
  format: string;
  fileName: string;
  sha256: string;
  size: number;
  url: string;
}

/** A file name from the server becomes a path in the output folder: only a plain name, never a path. */
export function safeFileName(name: string): boolean {
  return /^[A-Za-z0-9][A-Za-z0-9._-]{0,199}$/.test(name) && !name.includes('..') && name !== STATE_FILE && !name.endsWith('.tmp');
}

const names = (xs: string[]) => (xs.length ? xs.join(', ') : 'none');
const quoted = (xs: string[]) => xs.map((x) => `"${x}"`).join(', ');

/**
 * The artifacts for the requested targets and formats: every requested format of every requested target
 * that has it (a CSS easing exists only for CSS targets). "Not found" (exit 4), saying which, when a named
 * target is not in the manifest, a named format is in none of the chosen targets, or a named target has
 * none of the named formats.
 */
export function selectFiles(manifest: ManifestDto, targets: 'all' | string[], formats: 'all' | string[]): PlannedFile[] {
  const where = `pack "${manifest.pack}" v${manifest.version}`;
  const available = manifest.targets.map((t) => t.target);
  if (targets !== 'all') {
    const missing = targets.filter((t) => !available.includes(t));
    if (missing.length) throw new PullError(EXIT.notFound, `target not found: ${quoted(missing)} ${missing.length > 1 ? 'are' : 'is'} not in ${where} (targets: ${names(available)})`);
  }
  const chosen = targets === 'all' ? manifest.targets : targets.map((t) => manifest.targets.find((x) => x.target === t)!);
  if (chosen.length === 0) throw new PullError(EXIT.notFound, `target not found: ${where} has no targets`);
  if (formats !== 'all') {
    const missing = formats.filter((f) => !chosen.some((t) => t.artifacts.some((a) => a.format === f)));
    const have = [...new Set(chosen.flatMap((t) => t.artifacts.map((a) => a.format)))];
    if (missing.length) throw new PullError(EXIT.notFound, `format not found: no chosen target of ${where} (${names(chosen.map((t) => t.target))}) has ${quoted(missing)} (formats: ${names(have)})`);
  }
  const out: PlannedFile[] = [];
  for (const t of chosen) {
    const mine = t.artifacts.filter((a) => formats === 'all' || formats.includes(a.format));
    if (mine.length === 0 && targets !== 'all') {
      throw new PullError(EXIT.notFound, `format not found: target "${t.target}" of ${where} has none of ${quoted(formats as string[])} (formats: ${names(t.artifacts.map((a) => a.format))})`);
    }
    for (const a of mine) out.push({ target: t.target, format: a.format, fileName: a.fileName, sha256: a.sha256, size: a.size, url: a.url });
  }
  const seen = new Set<string>();
  for (const p of out) {
    if (!safeFileName(p.fileName)) throw new PullError(EXIT.other, `the server named a file "${p.fileName}", which is not a plain file name; nothing written`);
    if (seen.has(p.fileName)) throw new PullError(EXIT.other, `two requested artifacts share the file name "${p.fileName}"; pull them into separate folders`);
    seen.add(p.fileName);
  }
  return out;
}

export type FileDecision =
  /** the file on disk already has the manifest's SHA-256: no request, nothing written */
  | { action: 'keep' }
  /** request it; send If-None-Match with the SHA-256 of the bytes on disk when there are any */
  | { action: 'fetch'; ifNoneMatch: string | null };

/** `onDisk`: the SHA-256 of the file now in the output folder, or null when there is none. */
export function decide(file: PlannedFile, onDisk: string | null): FileDecision {
  if (onDisk === file.sha256) return { action: 'keep' };
  // the artifact's ETag is its SHA-256 in quotes (a strong validator, RFC 9110 §8.8.3)
  return { action: 'fetch', ifNoneMatch: onDisk ? `"${onDisk}"` : null };
}
