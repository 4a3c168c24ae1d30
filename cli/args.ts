/**
 * A small argument parser: `--name value`, `--name=value`, boolean `--flag`, positionals.
 * Unlike node:util parseArgs it takes a value that starts with '-' (e.g. `--at -0.5,0`).
 */
import { CliError } from './types';

export interface ParsedArgs {
  values: Record<string, string | undefined>;
  flags: Set<string>;
  positionals: string[];
}

export function parseCliArgs(argv: string[], spec: { strings?: string[]; booleans?: string[] }, usage: string): ParsedArgs {
  const strings = new Set(spec.strings ?? []);
  const booleans = new Set([...(spec.booleans ?? []), 'help']);
  const values: Record<string, string | undefined> = {};
  const flags = new Set<string>();
  const positionals: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--') { positionals.push(...argv.slice(i + 1)); break; }
    if (a === '-h') { flags.add('help'); continue; }
    if (!a.startsWith('--')) { positionals.push(a); continue; }
    const eq = a.indexOf('=');
    const name = a.slice(2, eq < 0 ? undefined : eq);
    if (strings.has(name)) {
      if (eq >= 0) values[name] = a.slice(eq + 1);
      else if (i + 1 < argv.length) values[name] = argv[++i];
      else throw new CliError(`option --${name} needs a value\n\n${usage}`, 2);
    } else if (booleans.has(name) && eq < 0) flags.add(name);
    else throw new CliError(`unknown option --${name}\n\n${usage}`, 2);
  }
  return { values, flags, positionals };
}
