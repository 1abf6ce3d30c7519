/** A problem the user can fix: the CLI prints its message as one line and exits with `code` (2: usage). */
export class CliError extends Error {
  constructor(
    message: string,
    readonly code = 1,
  ) {
    super(message);
  }
}
