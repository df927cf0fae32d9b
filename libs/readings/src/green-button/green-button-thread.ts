/**
 * The body of the Green Button reading thread: receives the file's bytes chunk by chunk from the API
 * process, decodes them as UTF-8 and feeds the streaming reader, so a large file never holds up the
 * API's event loop. Answers once: the usage, or the reason the file was refused.
 */
import { parentPort } from 'node:worker_threads';
import { createGreenButtonReader, GreenButtonFormatError } from './parse-green-button';

/** Messages the API process sends. */
export type ToGreenButtonThread = { kind: 'chunk'; bytes: Uint8Array } | { kind: 'end' };

const port = parentPort!;
const decoder = new TextDecoder('utf-8', { fatal: true });
const reader = createGreenButtonReader();
let done = false;

function finish(step: () => unknown): void {
  try {
    const usage = step();
    if (usage !== undefined) {
      done = true;
      port.postMessage({ kind: 'usage', usage });
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
