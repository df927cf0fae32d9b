/**
 * What every subcommand receives: its own arguments and a way to read standard input.
 */
import { parseArgs, type ParseArgsConfig } from 'node:util';
import { InputError } from './input-error';
import { parseSeries, type InputSeries, type ParseOptions } from './parse-series';
import { readInput } from './read-input';

/** Arguments after the subcommand name, and standard input when no --input is given. */
export interface CommandContext {
  /** Arguments after the subcommand name. */
  args: string[];
  /** All of standard input, or null when nothing is piped. */
  readStdin: () => Promise<string | null>;
}

/** A subcommand: returns the object to print as JSON. */
export type Command = (context: CommandContext) => Promise<unknown>;

/** parseArgs in strict mode, with its errors turned into one-line input errors. */
export function parseOptions<T extends NonNullable<ParseArgsConfig['options']>>(args: string[], options: T) {
  try {
    return parseArgs({ args, options, strict: true, allowPositionals: false }).values;
  } catch (error) {
    throw new InputError((error as Error).message.split('\n')[0]);
  }
}

/** Reads and parses the series named by --input, or standard input. */
export async function loadInputSeries(file: string | undefined, context: CommandContext, options: ParseOptions = {}): Promise<InputSeries> {
  const { text, name } = await readInput({ file, readStdin: context.readStdin });
  return parseSeries(text, name, options);
}
