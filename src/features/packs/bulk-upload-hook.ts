/**
 * `POST /api/teams/:teamId/packs/:pack/uploads` (multipart) with upload progress. fetch() reports no
 * upload progress, so this one request goes through XMLHttpRequest and its `upload.onprogress` events
 * (XMLHttpRequest Living Standard, "upload" and ProgressEvent). Failures become the same ApiError the
 * rest of the client uses (status, code, the server's fields).
 */
import { useCallback, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { ApiError, NETWORK_ERROR_STATUS } from '../../lib/api-client';
import { UPLOAD_FILES_FIELD, type UploadFileResult, type UploadResponse } from '../../../shared/schemas/uploads';
import { packQueryKey, packsQueryKey } from './api/packs-keys';

export type UploadPhase = 'idle' | 'sending' | 'processing' | 'done' | 'failed';

export interface BulkUploadState {
  phase: UploadPhase;
  /** Bytes sent and the request's total (null until the first progress event). */
  sent: number;
  total: number | null;
  results: UploadFileResult[] | null;
  error: ApiError | null;
}

const IDLE: BulkUploadState = { phase: 'idle', sent: 0, total: null, results: null, error: null };

function errorOf(xhr: XMLHttpRequest, url: string): ApiError {
  let body: unknown;
  try { body = JSON.parse(xhr.responseText); } catch { body = undefined; }
  const e = (body as { error?: { code?: string; message?: string; fields?: Record<string, string> } } | undefined)?.error;
  if (e?.code && e.message) return new ApiError({ status: xhr.status, code: e.code, message: e.message, fields: e.fields, body });
  return new ApiError({ status: xhr.status, code: `http_${xhr.status}`, message: `${url} answered HTTP ${xhr.status}.`, body });
}

export function useBulkUpload(teamId: string, slug: string) {
  const qc = useQueryClient();
  const [state, setState] = useState<BulkUploadState>(IDLE);
  const current = useRef<XMLHttpRequest | null>(null);

  const start = useCallback((files: readonly File[], tolerance: string) => {
    const url = `/api/teams/${teamId}/packs/${encodeURIComponent(slug)}/uploads`;
    const form = new FormData();
    if (tolerance.trim() !== '') form.append('tolerance', tolerance.trim());
    for (const f of files) form.append(UPLOAD_FILES_FIELD, f, f.name);
    const xhr = new XMLHttpRequest();
    current.current = xhr;
    setState({ ...IDLE, phase: 'sending' });
    xhr.upload.onprogress = (e) => setState((s) => ({ ...s, sent: e.loaded, total: e.lengthComputable ? e.total : null }));
    // every byte is sent: the server is converting and storing now
    xhr.upload.onload = () => setState((s) => ({ ...s, phase: 'processing', sent: s.total ?? s.sent }));
    xhr.onload = () => {
      current.current = null;
      if (xhr.status === 200) {
        let body: UploadResponse;
        try { body = JSON.parse(xhr.responseText) as UploadResponse; } catch {
          setState((s) => ({ ...s, phase: 'failed', error: new ApiError({ status: xhr.status, code: 'bad_response', message: `The server's answer for ${url} was not JSON.` }) }));
          return;
        }
        setState((s) => ({ ...s, phase: 'done', results: body.results }));
        void qc.invalidateQueries({ queryKey: packQueryKey(teamId, slug) });
        void qc.invalidateQueries({ queryKey: packsQueryKey(teamId), exact: true });
      } else setState((s) => ({ ...s, phase: 'failed', error: errorOf(xhr, url) }));
    };
    xhr.onerror = () => {
      current.current = null;
      setState((s) => ({ ...s, phase: 'failed', error: new ApiError({ status: NETWORK_ERROR_STATUS, code: 'network_error', message: `Could not reach the server for ${url}.` }) }));
    };
    xhr.open('POST', url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.send(form);
  }, [qc, teamId, slug]);

  const reset = useCallback(() => { current.current?.abort(); current.current = null; setState(IDLE); }, []);

  return { state, start, reset };
}
