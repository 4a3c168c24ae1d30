/**
 * Bulk upload into a pack: each file is converted on its own (./convert-upload.ts) and stored on its own
 * — one transaction per file, so a file's curves are all stored or none are, and one bad file never
 * stops the others.
 *
 * Names: a curve whose name is already used in the pack (or by an earlier curve of the same request)
 * is stored under the first free numbered name `<name>-2`, `<name>-3`, … (names stay unique in a pack;
 * the answer lists the name each curve got). Chosen over a per-file error because a bulk upload is
 * usually a re-export of files already uploaded once, and the person can rename or delete afterwards.
 */
import { UniqueConstraintError } from 'sequelize';
import type { PackDto } from '../../shared/schemas/packs';
import type { UploadFileResult, UploadedCurve } from '../../shared/schemas/uploads';
import { conflict } from '../http/errors';
import type { Principal } from '../auth/principal';
import { getPack } from '../packs/packs.service';
import * as packsRepo from '../packs/packs.repository';
import { convertUpload } from './convert-upload';

export interface UploadedFile {
  name: string;
  bytes: Uint8Array;
}

/** The first of `name`, `name-2`, `name-3`, … not in `taken` (at most 200 characters, the schema's limit). */
export function freeName(name: string, taken: ReadonlySet<string>): string {
  if (!taken.has(name)) return name;
  for (let n = 2; ; n++) {
    const suffix = `-${n}`;
    const candidate = `${name.slice(0, 200 - suffix.length)}${suffix}`;
    if (!taken.has(candidate)) return candidate;
  }
}

export interface UploadOutcome {
  pack: PackDto;
  results: UploadFileResult[];
  /** Files whose curves were stored, files refused, curves stored. */
  counts: { files: number; stored: number; failed: number; curves: number };
}

/** The pack a person may upload into (404 when unseen, 409 when archived). */
export async function uploadTarget(p: Principal, teamId: string, slug: string): Promise<PackDto> {
  const pack = await getPack(p, teamId, slug);
  if (pack.archived) throw conflict(`Pack "${pack.slug}" is archived; restore it before uploading curves.`, 'pack_archived');
  return pack;
}

export async function uploadFiles(pack: PackDto, files: readonly (UploadedFile | { name: string; refused: string })[], tolerance: number): Promise<UploadOutcome> {
  const results: UploadFileResult[] = [];
  for (const f of files) {
    if ('refused' in f) {
      results.push({ file: f.name, ok: false, error: f.refused, field: 'files' });
      continue;
    }
    const converted = convertUpload(f.name, f.bytes, { tolerance, frameRate: pack.frameRate });
    if (!converted.ok) {
      results.push({ file: f.name, ok: false, error: converted.error, field: converted.field });
      continue;
    }
    try {
      const curves = await packsRepo.inTransaction(async (transaction) => {
        const taken = new Set((await packsRepo.listCurves(pack.id, transaction)).map((c) => c.name));
        const stored: UploadedCurve[] = [];
        for (const c of converted.curves) {
          const name = freeName(c.doc.name, taken);
          taken.add(name);
          const row = await packsRepo.insertCurve(pack.id, { ...c.doc, name }, transaction);
          stored.push({ id: row.id, name: row.name, keys: c.doc.keys.length, maxError: c.maxError });
        }
        return stored;
      });
      results.push({ file: f.name, ok: true, curves, ...(converted.warnings.length ? { warnings: converted.warnings } : {}) });
    } catch (err) {
      // another request took a name between the read and the insert: this file's curves were rolled back
      if (err instanceof UniqueConstraintError) {
        results.push({ file: f.name, ok: false, error: 'a curve name was taken by another change at the same moment; nothing of this file was stored, upload it again', field: 'files' });
        continue;
      }
      throw err;
    }
  }
  const stored = results.filter((r) => r.ok);
  return {
    pack,
    results,
    counts: { files: results.length, stored: stored.length, failed: results.length - stored.length, curves: stored.reduce((n, r) => n + (r.ok ? r.curves.length : 0), 0) },
  };
}
