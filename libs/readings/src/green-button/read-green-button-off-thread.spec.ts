import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { GreenButtonFormatError, parseGreenButton } from './parse-green-button';
import { GreenButtonTooLargeError, readGreenButtonOffThread } from './read-green-button-off-thread';

const fixture = (name: string) => readFileSync(resolve(import.meta.dirname, '../../../../fixtures/green-button', name));

async function* chunks(bytes: Buffer, size: number) {
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

describe('readGreenButtonOffThread', () => {
  it('reads a file streamed in 100-byte chunks in a worker thread, as parseGreenButton reads it whole, with its size and hash', async () => {
    const bytes = fixture('hourly-energy-wh.xml');
    const read = await readGreenButtonOffThread(chunks(bytes, 100), { maxBytes: 1_000_000, hashPrefix: 'gb-pump\n' });
    expect(read.usage).toEqual(parseGreenButton(bytes.toString('utf8')));
    expect(read.byteSize).toBe(bytes.length);
    expect(read.sha256).toBe(createHash('sha256').update('gb-pump\n').update(bytes).digest('hex'));
  });

  it('refuses a DTD and bytes that are not UTF-8 with the reason', async () => {
    const dtd = Buffer.from('<?xml version="1.0"?><!DOCTYPE feed [<!ENTITY a "a">]><feed/>');
    await expect(readGreenButtonOffThread(chunks(dtd, 10), { maxBytes: 1000 })).rejects.toThrow(GreenButtonFormatError);
    await expect(readGreenButtonOffThread(chunks(dtd, 10), { maxBytes: 1000 })).rejects.toThrow(/declares a DTD/);
    const latin1 = Buffer.from([...Buffer.from('<feed><title>Caf'), 0xe9, ...Buffer.from('</title></feed>')]);
    await expect(readGreenButtonOffThread(chunks(latin1, 4), { maxBytes: 1000 })).rejects.toThrow(/not UTF-8/);
  });

  it('refuses a file over the limit', async () => {
    const bytes = fixture('hourly-energy-wh.xml');
    await expect(readGreenButtonOffThread(chunks(bytes, 100), { maxBytes: 1000 })).rejects.toThrow(GreenButtonTooLargeError);
  });
});
