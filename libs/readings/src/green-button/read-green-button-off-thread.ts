/**
 * Reads a Green Button file in a worker thread while it streams in: the API process only passes the
 * bytes on (and hashes them), so parsing a 20 MB feed never blocks other requests.
 */
import { createHash } from 'node:crypto';
import { Worker } from 'node:worker_threads';
import { GreenButtonFormatError, type GreenButtonUsage } from './parse-green-button';
import type { FromGreenButtonThread, ToGreenButtonThread } from './green-button-thread';

/** The file is larger than allowed; nothing was read past the limit. */
export class GreenButtonTooLargeError extends Error {
  override readonly name = 'GreenButtonTooLargeError';
}

/** What reading a streamed file gives: its usage, its size and the SHA-256 of `hashPrefix` followed by its bytes. */
export interface StreamedGreenButton {
  usage: GreenButtonUsage;
  byteSize: number;
  sha256: string;
}

const entry = new URL('./green-button-thread-entry.mjs', import.meta.url);

/**
 * Streams `source` into a reading thread.
 * @throws GreenButtonFormatError when the file is refused (as soon as the thread sees why),
 *   GreenButtonTooLargeError beyond `maxBytes`.
 */
export async function readGreenButtonOffThread(
  source: AsyncIterable<Buffer | string>,
  { maxBytes, hashPrefix = '' }: { maxBytes: number; hashPrefix?: string },
): Promise<StreamedGreenButton> {
  const worker = new Worker(entry);
  const hash = createHash('sha256').update(hashPrefix);
  let byteSize = 0;
  const answer = new Promise<GreenButtonUsage>((resolve, reject) => {
    worker.once('message', (message: FromGreenButtonThread) => {
      if (message.kind === 'usage') {
        const { startSeconds, durationSeconds, value } = message.columns;
        const intervals = Array.from(startSeconds, (start, i) => ({
          startSeconds: start,
          durationSeconds: durationSeconds[i]!,
          value: value[i]!,
        }));
        resolve({ ...message.usage, intervals });
      } else if (message.kind === 'refused') reject(new GreenButtonFormatError(message.message));
      else reject(new Error(`Green Button reading thread failed: ${message.message}`));
    });
    worker.once('error', reject);
    worker.once('exit', (code) => reject(new Error(`Green Button reading thread exited with code ${code}`)));
  });
  // Stop sending as soon as the thread has answered (a refusal arrives before the end of the file).
  let answered = false;
  answer.then(
    () => (answered = true),
    () => (answered = true),
  );
  const send = (message: ToGreenButtonThread, transfer: ArrayBuffer[] = []) => worker.postMessage(message, transfer);
  try {
    // The source is read to its end even after a refusal, so the client can still be sent the answer
    // (leaving a request body unread would reset the connection under it).
    for await (const chunk of source) {
      const bytes = typeof chunk === 'string' ? Buffer.from(chunk) : chunk;
      byteSize += bytes.length;
      if (answered || byteSize > maxBytes) continue;
      hash.update(bytes);
      // A copy the thread owns, so the request's buffer can be reused.
      const copy = new Uint8Array(bytes);
      send({ kind: 'chunk', bytes: copy }, [copy.buffer]);
    }
    if (byteSize > maxBytes) throw new GreenButtonTooLargeError(`The file is larger than ${maxBytes} bytes.`);
    if (!answered) send({ kind: 'end' });
    const usage = await answer;
    return { usage, byteSize, sha256: hash.digest('hex') };
  } finally {
    answer.catch(() => undefined);
    await worker.terminate();
  }
}
