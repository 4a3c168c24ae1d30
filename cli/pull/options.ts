/**
 * The arguments of `cli pull`. Unlike cli/args.ts, --target and --format may be repeated (or hold a
 * comma-separated list, or `all`). The token may come from TANGENTRY_TOKEN instead of --token, so it stays
 * out of shell history and process listings. Every usage error names its flag (exit 2).
 */
import { channelParam, formatParam, packParam, targetParam } from '../../shared/schemas/api-v1';
import { EXIT, PullError } from './exit-codes';

export interface PullOptions {
  server: URL;
  token: string;
  pack: string;
  channel: string;
  /** 'all' or the target file stems (handheld-tight), without duplicates, in the order given. */
  targets: 'all' | string[];
  formats: 'all' | string[];
  out: string;
  /** A team id (UUID) or slug; absent: the one team whoami reports. */
  team: string | null;
  json: boolean;
  timeoutMs: number;
  retries: number;
  help: boolean;
}

const STRINGS = ['server', 'token', 'pack', 'channel', 'target', 'format', 'out', 'team', 'timeout', 'retries'] as const;
const REPEATABLE = new Set(['target', 'format']);
const BOOLEANS = new Set(['json', 'help']);

const usage = (message: string) => new PullError(EXIT.usage, message);

/** Checks a name against the API's path-parameter schema; its message starts with the parameter's name. */
function checkName(flag: string, value: string, schema: typeof packParam): string {
  const r = schema.safeParse(value);
  if (!r.success) throw usage(`--${flag}: "${value}" is not valid (${r.error.issues[0]!.message.replace(/^\w+: /, '')})`);
  return value;
}

function list(flag: string, values: string[], schema: typeof packParam): 'all' | string[] {
  const items = values.flatMap((v) => v.split(',')).map((v) => v.trim()).filter((v) => v !== '');
  if (items.length === 0) throw usage(`--${flag} is required (a name, a comma-separated list, repeated, or "all")`);
  if (items.includes('all')) {
    if (items.length > 1) throw usage(`--${flag}: "all" cannot be combined with names`);
    return 'all';
  }
  return [...new Set(items.map((v) => checkName(flag, v, schema)))];
}

function boundedNumber(flag: string, raw: string | undefined, fallback: number, opts: { integer?: boolean; min: number; max: number }): number {
  if (raw === undefined) return fallback;
  const n = Number(raw);
  const low = opts.integer ? n < opts.min : n <= opts.min;
  if (raw.trim() === '' || !Number.isFinite(n) || low || n > opts.max || (opts.integer && !Number.isInteger(n))) {
    throw usage(`--${flag}: "${raw}" must be a ${opts.integer ? `whole number from ${opts.min}` : `number above ${opts.min}`} up to ${opts.max}`);
  }
  return n;
}

export function parsePullOptions(argv: string[], env: Record<string, string | undefined> = {}): PullOptions {
  const single: Record<string, string> = {};
  const repeated: Record<string, string[]> = { target: [], format: [] };
  const flags = new Set<string>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === '-h') { flags.add('help'); continue; }
    if (!a.startsWith('--')) throw usage(`unexpected argument "${a}" (pull takes only --flags)`);
    const eq = a.indexOf('=');
    const name = a.slice(2, eq < 0 ? undefined : eq);
    if ((STRINGS as readonly string[]).includes(name)) {
      let value: string;
      if (eq >= 0) value = a.slice(eq + 1);
      else if (i + 1 < argv.length && !argv[i + 1]!.startsWith('--')) value = argv[++i]!;
      else throw usage(`--${name} needs a value`);
      if (REPEATABLE.has(name)) repeated[name]!.push(value);
      else if (name in single) throw usage(`--${name} was given twice`);
      else single[name] = value;
    } else if (BOOLEANS.has(name) && eq < 0) flags.add(name);
    else throw usage(`unknown option --${name}`);
  }
  const help = flags.has('help');
  if (help) {
    return { server: new URL('http://localhost'), token: '', pack: '', channel: '', targets: [], formats: [], out: '', team: null, json: false, timeoutMs: 0, retries: 0, help };
  }
  const required = (flag: string) => {
    const v = single[flag];
    if (v === undefined || v.trim() === '') throw usage(`--${flag} is required`);
    return v.trim();
  };
  const rawServer = required('server');
  let server: URL;
  try {
    server = new URL(rawServer);
  } catch {
    throw usage(`--server: "${rawServer}" is not a URL (e.g. https://tangentry.example.com)`);
  }
  if (server.protocol !== 'http:' && server.protocol !== 'https:') throw usage(`--server: must be an http:// or https:// URL, not ${server.protocol}`);
  if (server.search || server.hash) throw usage('--server: give the server\'s base URL without a query or fragment');
  const token = (single.token ?? env.TANGENTRY_TOKEN ?? '').trim();
  if (!token) throw usage('--token is required (or set TANGENTRY_TOKEN in the environment)');
  const team = single.team?.trim() || null;
  if (single.team !== undefined && !team) throw usage('--team: must not be empty');
  return {
    server,
    token,
    pack: checkName('pack', required('pack'), packParam),
    channel: checkName('channel', required('channel'), channelParam),
    targets: list('target', repeated.target!, targetParam),
    formats: list('format', repeated.format!, formatParam),
    out: required('out'),
    team,
    json: flags.has('json'),
    timeoutMs: boundedNumber('timeout', single.timeout, 30, { min: 0, max: 3600 }) * 1000,
    retries: boundedNumber('retries', single.retries, 2, { integer: true, min: 0, max: 10 }),
    help,
  };
}
