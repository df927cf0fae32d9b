/**
 * The body of the Green Button reading thread: receives the file's bytes chunk by chunk from the API
 * process, decodes them as UTF-8 and feeds the streaming reader, so a large file never holds up the
 * API's event loop. Answers once: the usage, or the reason the file was refused.
 */
import { parentPort } from 'node:worker_threads';
import { createGreenButtonReader, GreenButtonFormatError, type GreenButtonUsage } from './parse-green-button';

/** Messages the API process sends. */
export type ToGreenButtonThread = { kind: 'chunk'; bytes: Uint8Array } | { kind: 'end' };

/** The answer: the usage without its intervals, and the intervals as columns; or why the file was refused. */
export type FromGreenButtonThread =
  | {
      kind: 'usage';
      usage: Omit<GreenButtonUsage, 'intervals'>;
      columns: { startSeconds: Float64Array; durationSeconds: Float64Array; value: Float64Array };
    }
  | { kind: 'refused' | 'failed'; message: string };

const port = parentPort!;
const decoder = new TextDecoder('utf-8', { fatal: true });
const reader = createGreenButtonReader();
let done = false;

function finish(step: () => unknown): void {
  try {
    const usage = step() as GreenButtonUsage | undefined;
    if (usage !== undefined) {
      done = true;
      // Intervals travel as three transferred number arrays: cloning 100,000 small objects would cost
      // the API's event loop a fifth of a second to receive.
      const { intervals, ...rest } = usage;
      const columns = {
        startSeconds: Float64Array.from(intervals, (i) => i.startSeconds),
        durationSeconds: Float64Array.from(intervals, (i) => i.durationSeconds),
        value: Float64Array.from(intervals, (i) => i.value),
      };
      port.postMessage({ kind: 'usage', usage: rest, columns }, [
        columns.startSeconds.buffer,
        columns.durationSeconds.buffer,
        columns.value.buffer,
      ]);
    }
  } catch (error) {
    done = true;
    const refused = error instanceof GreenButtonFormatError || error instanceof TypeError; // TypeError: bytes that are not UTF-8
    const message =
      error instanceof TypeError
        ? 'The file is not UTF-8 text; save the Green Button XML as UTF-8 and send it again.'
        : (error as Error).message;
    port.postMessage({ kind: refused ? 'refused' : 'failed', message });
  }
}

port.on('message', (message: ToGreenButtonThread) => {
  if (done) return;
  if (message.kind === 'chunk') finish(() => void reader.write(decoder.decode(message.bytes, { stream: true })));
  else finish(() => (reader.write(decoder.decode()), reader.end()));
});
