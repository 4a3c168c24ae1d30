/**
 * `cli pull`: fetch a channel's artifacts into a folder, downloading only what changed.
 *   1. the team: --team, else the one team GET /api/v1/whoami reports;
 *   2. the channel (If-None-Match with the ETag of the last read; a 304 reuses the stored body);
 *   3. per requested target and format: a file on disk with the manifest's SHA-256 is kept without a
 *      request; otherwise GET the artifact (If-None-Match with the SHA-256 of the bytes on disk, if any),
 *      check the bytes against the manifest's SHA-256 and size and the X-Content-SHA256 header;
 *   4. only when every changed file has arrived and checks out, write each atomically (./atomic-write.ts).
 *      A mismatch or failure in any file writes nothing and keeps the old files.
 * Returns the exit code (./exit-codes.ts); never calls process.exit().
 */
import { createHash } from 'node:crypto';
import { mkdir, readFile, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { channelResponseSchema, whoamiSchema, type ManifestDto } from '../../shared/schemas/api-v1';
import { writeFileAtomic } from './atomic-write';
import { EXIT, EXIT_HELP, PullError, type ExitCode } from './exit-codes';
import { failureFor, get, type GetOptions, type HttpDeps } from './http';
import { parsePullOptions, type PullOptions } from './options';
import { decide, selectFiles, type PlannedFile } from './plan';
import { channelKey, readState, writeState, type PullState } from './state';

export const PULL_USAGE = `Usage: npm run --silent cli -- pull --server URL --token TOKEN --pack PACK --channel CHANNEL
         --target TARGET --format FORMAT --out DIR [--team ID|SLUG] [--json] [--timeout SECONDS] [--retries N]

Downloads the artifacts of the version a channel points at into DIR, only what changed, each checked
against the SHA-256 of the manifest and written atomically (temp file, fsync, rename).

  --server URL      the Tangentry server, e.g. https://tangentry.example.com
  --token TOKEN     a service token (tgt_…); or set TANGENTRY_TOKEN and leave --token out, so the
                    token stays out of shell history and process listings
  --pack PACK       the pack slug, e.g. menu-transitions
  --channel NAME    the channel, e.g. shipping
  --target TARGET   a target file stem (handheld, handheld-tight …); repeat it, list several with commas, or "all"
  --format FORMAT   json, binary, c, ts, gltf, css …; repeat it, list several with commas, or "all";
                    every named format of every named target that has it (css exists only for CSS targets)
  --out DIR         the folder to write into (created if missing); it keeps .tangentry-pull.json
  --team ID|SLUG    the team (id or slug); default: the one team the token belongs to
  --json            print one JSON object instead of one line per file
  --timeout SECONDS per request (default 30); --retries N on network failures and 502/503/504 (default 2)

${EXIT_HELP}`;

export interface PullIo {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  env: Record<string, string | undefined>;
  deps?: Partial<HttpDeps>;
}

export type FileAction = 'downloaded' | 'unchanged' | 'not-modified';
export interface FileResult {
  file: string;
  target: string;
  format: string;
  version: number;
  action: FileAction;
  sha256: string;
  size: number;
  /** the version the file on disk came from before this pull, when known */
  previousVersion: number | null;
}

interface Outcome {
  team: string | null;
  version: number | null;
  files: FileResult[];
}

const sha256Of = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');
const isUuid = (s: string) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(s);

async function onDiskSha(path: string): Promise<string | null> {
  try {
    return sha256Of(await readFile(path));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw err;
  }
}

/** The server's API base: the --server URL with any path kept (a server mounted under /tangentry/). */
function apiUrl(server: URL, path: string): string {
  return `${server.href.replace(/\/+$/, '')}${path.startsWith('/') ? path : `/${path}`}`;
}

function parseJson<T>(what: string, body: Uint8Array, schema: { safeParse(v: unknown): { success: true; data: T } | { success: false } }): T {
  let value: unknown;
  try {
    value = JSON.parse(new TextDecoder().decode(body));
  } catch {
    throw new PullError(EXIT.other, `${what}: the server's answer is not JSON`);
  }
  const r = schema.safeParse(value);
  if (!r.success) throw new PullError(EXIT.other, `${what}: the server's answer does not have the expected shape`);
  return r.data;
}

async function resolveTeam(deps: HttpDeps, o: PullOptions, base: GetOptions): Promise<string> {
  if (o.team && isUuid(o.team)) return o.team.toLowerCase();
  const r = await get(deps, apiUrl(o.server, '/api/v1/whoami'), { ...base, what: 'whoami' });
  if (r.status !== 200) throw failureFor('whoami', r);
  const who = parseJson('whoami', r.body, whoamiSchema);
  const list = who.teams.map((t) => t.slug).join(', ') || 'none';
  if (o.team) {
    const t = who.teams.find((x) => x.slug === o.team);
    if (!t) throw new PullError(EXIT.notFound, `team not found: "${o.team}" is not a team of ${who.principal.name} (teams: ${list})`);
    return t.id;
  }
  if (who.teams.length === 1) return who.teams[0]!.id;
  if (who.teams.length === 0) throw new PullError(EXIT.notFound, `team not found: ${who.principal.name} belongs to no team`);
  throw new PullError(EXIT.usage, `--team: ${who.principal.name} belongs to ${who.teams.length} teams (${list}); name one with --team`);
}

async function readChannel(deps: HttpDeps, o: PullOptions, base: GetOptions, team: string, state: PullState): Promise<{ manifest: ManifestDto; changed: boolean }> {
  const key = channelKey(o.pack, o.channel);
  const cached = state.channels[key];
  const what = `channel "${o.channel}" of pack "${o.pack}"`;
  const headers = { ...base.headers, ...(cached ? { 'If-None-Match': cached.etag } : {}) };
  const path = `/api/v1/teams/${encodeURIComponent(team)}/packs/${encodeURIComponent(o.pack)}/channels/${encodeURIComponent(o.channel)}`;
  const r = await get(deps, apiUrl(o.server, path), { ...base, headers, what });
  if (r.status === 304 && cached) return { manifest: cached.body.manifest, changed: false };
  if (r.status !== 200) throw failureFor(what, r);
  const body = parseJson(what, r.body, channelResponseSchema);
  const etag = r.headers.get('etag');
  if (etag) state.channels[key] = { etag, body };
  else delete state.channels[key];
  return { manifest: body.manifest, changed: true };
}

interface Fetched {
  result: FileResult;
  /** verified bytes to write, or null when the file on disk is already current */
  bytes: Uint8Array | null;
}

/** Requests one file when it changed and checks its bytes; writes nothing (see writeAll). */
async function fetchFile(deps: HttpDeps, o: PullOptions, base: GetOptions, manifest: ManifestDto, f: PlannedFile, state: PullState): Promise<Fetched> {
  const previousVersion = state.files[f.fileName]?.version ?? null;
  const result = (action: FileAction): FileResult => ({ file: f.fileName, target: f.target, format: f.format, version: manifest.version, action, sha256: f.sha256, size: f.size, previousVersion });
  const decision = decide(f, await onDiskSha(join(o.out, f.fileName)));
  if (decision.action === 'keep') return { result: result('unchanged'), bytes: null };
  const headers = { ...base.headers, ...(decision.ifNoneMatch ? { 'If-None-Match': decision.ifNoneMatch } : {}) };
  const r = await get(deps, apiUrl(o.server, f.url), { ...base, headers, what: f.fileName });
  if (r.status === 304) {
    // we named the bytes on disk, which are not the manifest's: the server and its manifest disagree
    throw new PullError(EXIT.checksum, `${f.fileName}: the server answered 304 for bytes on disk whose SHA-256 is not the manifest's ${f.sha256}; nothing written`);
  }
  if (r.status !== 200) throw failureFor(f.fileName, r);
  const got = sha256Of(r.body);
  const header = r.headers.get('x-content-sha256')?.trim().toLowerCase() ?? null;
  if (got !== f.sha256 || (header !== null && header !== f.sha256) || r.body.length !== f.size) {
    const why = got !== f.sha256 ? `the bytes hash to ${got}` : header !== f.sha256 ? `X-Content-SHA256 says ${header}` : `${r.body.length} bytes arrived instead of ${f.size}`;
    throw new PullError(EXIT.checksum, `${f.fileName}: checksum mismatch: the manifest says sha256 ${f.sha256} but ${why}; nothing written, the old files are kept`);
  }
  return { result: result('downloaded'), bytes: r.body };
}

function line(r: FileResult): string {
  const from = r.previousVersion !== null && r.previousVersion !== r.version ? ` (was v${r.previousVersion})` : '';
  const how = r.action === 'downloaded' ? `${r.size} B` : r.action === 'unchanged' ? 'sha256 matches, not requested' : 'server answered 304';
  return `${r.action.padEnd(12)} ${r.file}  ${r.target}/${r.format}  v${r.version}${from}  ${how}  sha256 ${r.sha256.slice(0, 12)}…`;
}

async function pull(o: PullOptions, io: PullIo, outcome: Outcome): Promise<void> {
  const deps: HttpDeps = { fetch: io.deps?.fetch ?? globalThis.fetch, sleep: io.deps?.sleep ?? ((ms) => new Promise((r) => setTimeout(r, ms))) };
  const base: GetOptions = {
    headers: { Authorization: `Bearer ${o.token}`, Accept: 'application/json, application/problem+json', 'User-Agent': 'tangentry-cli-pull/1' },
    timeoutMs: o.timeoutMs,
    retries: o.retries,
    what: '',
  };
  try {
    const s = await stat(o.out);
    if (!s.isDirectory()) throw new PullError(EXIT.usage, `--out: "${o.out}" exists and is not a folder`);
  } catch (err) {
    if (err instanceof PullError) throw err;
    if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw err;
    await mkdir(o.out, { recursive: true });
  }
  const team = await resolveTeam(deps, o, base);
  outcome.team = team;
  const { state, warning } = await readState(o.out, o.server.origin + o.server.pathname.replace(/\/+$/, ''), team);
  if (warning) io.stderr(`warning: ${warning}\n`);
  const before = JSON.stringify(state);
  try {
    const { manifest } = await readChannel(deps, o, base, team, state);
    outcome.version = manifest.version;
    // every changed file is fetched and verified before the first is written, so one bad download
    // leaves the whole folder as it was rather than half on the new version
    const fetched: Fetched[] = [];
    for (const f of selectFiles(manifest, o.targets, o.formats)) fetched.push(await fetchFile(deps, o, base, manifest, f, state));
    for (const { result: r, bytes } of fetched) {
      if (bytes) await writeFileAtomic(o.out, r.file, bytes);
      state.files[r.file] = { pack: manifest.pack, channel: o.channel, version: r.version, target: r.target, format: r.format, sha256: r.sha256, size: r.size };
      outcome.files.push(r);
      if (!o.json) io.stdout(`${line(r)}\n`);
    }
  } finally {
    // files already written stay recorded even when a later one fails; an unchanged state is not rewritten
    if (JSON.stringify(state) !== before) await writeState(o.out, state);
  }
}

export async function runPull(argv: string[], io: PullIo): Promise<ExitCode> {
  let o: PullOptions;
  try {
    o = parsePullOptions(argv, io.env);
  } catch (err) {
    io.stderr(`error: ${(err as Error).message}\n\nRun \`cli pull --help\` for the flags.\n`);
    return err instanceof PullError ? err.exitCode : EXIT.usage;
  }
  if (o.help) {
    io.stdout(`${PULL_USAGE}\n`);
    return EXIT.ok;
  }
  const outcome: Outcome = { team: null, version: null, files: [] };
  let code: ExitCode = EXIT.ok;
  let message: string | null = null;
  try {
    await pull(o, io, outcome);
  } catch (err) {
    code = err instanceof PullError ? err.exitCode : EXIT.other;
    message = err instanceof Error ? err.message : String(err);
    io.stderr(`error: ${message}\n`);
  }
  if (o.json) {
    io.stdout(`${JSON.stringify({
      ok: code === EXIT.ok, exitCode: code, server: o.server.href, team: outcome.team, pack: o.pack, channel: o.channel,
      version: outcome.version, files: outcome.files, error: message,
    })}\n`);
  }
  return code;
}
