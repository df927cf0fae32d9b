/**
 * Reads the command's input text from `--input FILE` or, without it, from standard input.
 */
import { readFile } from 'node:fs/promises';
import { InputError } from './input-error';

/** Where the input text comes from; `stdin` is injectable so the dispatcher stays testable. */
export interface InputSource {
  /** The --input path, if given. */
  file: string | undefined;
  /** All of standard input, or null when nothing is piped. */
  readStdin: () => Promise<string | null>;
}

/** The input text and a name for it in messages. */
export async function readInput(source: InputSource): Promise<{ text: string; name: string }> {
  if (source.file !== undefined) {
    try {
      return { text: await readFile(source.file, 'utf8'), name: source.file };
    } catch (error) {
      throw new InputError(`cannot read --input ${source.file}: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`);
    }
  }
  const text = await source.readStdin();
  if (text === null) throw new InputError('no input: pass --input FILE or pipe the series on standard input');
  return { text, name: 'standard input' };
}
