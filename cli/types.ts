/** One CLI command: `cli/commands/<name>.ts` default-exports this. */
export interface CliCommand {
  name: string;
  /** One line for `cli --help`. */
  summary: string;
  /** Run with the arguments after the command name; resolves to the exit code (0 = success). */
  run(argv: string[]): Promise<number>;
}

/** An error the user can fix: printed to stderr without a stack, exit code `code` (2 = usage). */
export class CliError extends Error {
  constructor(message: string, readonly code = 1) {
    super(message);
  }
}
