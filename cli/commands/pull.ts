/**
 * `cli pull --server URL --token T --pack P --channel C --target X --format F --out DIR`: a build script's
 * way to fetch a channel's tables (cli/pull/run.ts). Exit codes are listed in `cli pull --help`.
 */
import type { CliCommand } from '../types';
import { runPull } from '../pull/run';

const command: CliCommand = {
  name: 'pull',
  summary: 'download a channel\'s artifacts into a folder, only what changed, SHA-256 checked',
  run: (argv) => runPull(argv, { stdout: (t) => process.stdout.write(t), stderr: (t) => process.stderr.write(t), env: process.env }),
};

export default command;
