/**
 * A problem with what the user gave the command (arguments, file or data). The command prints its
 * message as one line on standard error and exits with status 2.
 */
export class InputError extends Error {
  override readonly name = 'InputError';
}
