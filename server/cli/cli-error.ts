/**
 * A problem the command line reports as one line (no stack trace) before exiting with
 * `exitCode` (2 for bad input or configuration, as is usual for command-line usage errors).
 */
export class CliError extends Error {
  override readonly name = 'CliError';
  constructor(
    message: string,
    readonly exitCode = 2,
  ) {
    super(message);
  }
}
