/**
 * The command registry: one line per command, loaded only when used (or for `--help`).
 * To add a command, create cli/commands/<name>.ts default-exporting a CliCommand and add its line.
 */
import type { CliCommand } from './types';

export const COMMANDS: Record<string, () => Promise<{ default: CliCommand }>> = {
  eval: () => import('./commands/eval'),
  fit: () => import('./commands/fit'),
  bake: () => import('./commands/bake'),
  pull: () => import('./commands/pull'),
};
