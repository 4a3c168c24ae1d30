/**
 * Bulk upload of curve files into a pack (POST /api/teams/:teamId/packs/:pack/uploads, multipart):
 * the form's fields, the limits, the accepted file kinds and the per-file answer. Shared by the server
 * (validation at the edge, the limits multer enforces) and the upload panel (what it may pick, what
 * it shows). Messages start with the field name.
 */
import { z } from 'zod';

/** The multipart field that carries the files (one part per file). */
export const UPLOAD_FILES_FIELD = 'files';

/** File kinds by extension (lower-case, with the dot); the content is sniffed too (see server/uploads). */
export const UPLOAD_EXTENSIONS = ['.csv', '.json', '.gltf', '.glb'] as const;
export type UploadExtension = (typeof UPLOAD_EXTENSIONS)[number];

export interface UploadLimits {
  /** Bytes per file. */
  fileSize: number;
  /** Files per request. */
  files: number;
  /** Bytes per non-file field value. */
  fieldSize: number;
  /** Non-file fields per request. */
  fields: number;
}

/** Defaults: 2 MB a file, 50 files, small form fields (the only field is the tolerance). */
export const UPLOAD_LIMITS: UploadLimits = { fileSize: 2 * 1024 * 1024, files: 50, fieldSize: 1024, fields: 8 };

/** Default key-reduction tolerance, absolute, in the curve's value units (the editor's import uses the same). */
export const UPLOAD_DEFAULT_TOLERANCE = 1e-3;

/** The form's text fields (multipart values arrive as strings). */
export const uploadFormSchema = z.object({
  tolerance: z
    .string({ error: 'tolerance: must be a number' })
    .trim()
    .optional()
    .transform((s, ctx) => {
      if (s === undefined || s === '') return UPLOAD_DEFAULT_TOLERANCE;
      const v = Number(s);
      if (!Number.isFinite(v) || !(v > 0)) {
        ctx.addIssue({ code: 'custom', message: `tolerance: must be a positive number (value units), got "${s}"` });
        return z.NEVER;
      }
      return v;
    }),
});
export type UploadForm = z.output<typeof uploadFormSchema>;

export interface UploadedCurve {
  id: string;
  name: string;
  /** Keys of the stored curve. */
  keys: number;
  /** Largest |stored curve − file| found (0 when the file's curve is stored as it is). */
  maxError: number;
}

export type UploadFileResult =
  | { file: string; ok: true; curves: UploadedCurve[]; warnings?: string[] }
  | { file: string; ok: false; error: string; field: string };

export interface UploadResponse {
  results: UploadFileResult[];
}

/** Lower-case extension of a file name including the dot ('' when there is none). */
export function extensionOf(fileName: string): string {
  const dot = fileName.lastIndexOf('.');
  return dot <= 0 ? '' : fileName.slice(dot).toLowerCase();
}

export function isUploadExtension(ext: string): ext is UploadExtension {
  return (UPLOAD_EXTENSIONS as readonly string[]).includes(ext);
}
