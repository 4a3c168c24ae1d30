/**
 * Tangentry command line: `npm run --silent cli -- <command> [arguments]`.
 * Output goes to stdout, errors to stderr with a non-zero exit code (1 = failed, 2 = usage).
 * Ends by setting process.exitCode (never process.exit(), which could cut buffered output).
 */
import { COMMANDS } from './registry';
import { CliError } from './types';

async function usage(): Promise<string> {
  const lines = ['Usage: npm run --silent cli -- <command> [arguments]', '', 'Commands:'];
  for (const name of Object.keys(COMMANDS)) {
    const cmd = (await COMMANDS[name]()).default;
    lines.push(`  ${name.padEnd(8)} ${cmd.summary}`);
  }
  lines.push('', 'Run `cli <command> --help` for its arguments.');
  return lines.join('\n');
}

async function main(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    const text = await usage();
    if (name === undefined) {
      process.stderr.write(`${text}\n`);
      return 2;
    }
    process.stdout.write(`${text}\n`);
    return 0;
  }
  const load = Object.hasOwn(COMMANDS, name) ? COMMANDS[name] : undefined;
  if (!load) {
    process.stderr.write(`error: unknown command "${name}" (commands: ${Object.keys(COMMANDS).join(', ')})\n`);
    return 2;
  }
  try {
    return await (await load()).default.run(rest);
  } catch (e) {
    if (e instanceof CliError) {
      process.stderr.write(`error: ${e.message}\n`);
      return e.code;
    }
    process.stderr.write(`error: ${e instanceof Error ? e.message : String(e)}\n`);
    return 1;
  }
}

main(process.argv.slice(2)).then(
  (code) => { process.exitCode = code; },
  (e: unknown) => { process.stderr.write(`error: ${String(e)}\n`); process.exitCode = 1; },
);
