/**
 * The intake benchmarks' file: `rows` readings of `seriesCount` hourly load series (fdr-1 … fdr-N) in
 * long format (timestamp, series, value_kw) from 2015-01-01T00:00Z, a daily cycle with a little
 * deterministic noise, and an occasional missing hour so estimation runs too. Returns the row count.
 */
import { createWriteStream } from 'node:fs';
import { once } from 'node:events';

const hourMs = 3_600_000;
const start = Date.UTC(2015, 0, 1);

/** Writes the file to `path`, streamed in chunks of 10,000 lines. */
export async function writeLoadFile(path: string, rows: number, seriesCount: number): Promise<number> {
  const out = createWriteStream(path);
  out.write('timestamp,series,value_kw\n');
  const hours = Math.ceil(rows / seriesCount);
  let written = 0;
  let chunk: string[] = [];
  for (let h = 0; h < hours && written < rows; h++) {
    const ts = new Date(start + h * hourMs).toISOString();
    const daily = Math.sin(((h % 24) / 24) * 2 * Math.PI - Math.PI / 2);
    for (let s = 1; s <= seriesCount && written < rows; s++) {
      written++;
      if ((h + s * 977) % 5003 === 0) continue; // an occasional missing hour
      const noise = (((s * 2654435761 + h * 40503) >>> 0) % 1000) / 1000 - 0.5;
      chunk.push(`${ts},fdr-${s},${(400 + 40 * s + 120 * daily + 8 * noise).toFixed(1)}\n`);
    }
    if (chunk.length >= 10_000) {
      if (!out.write(chunk.join(''))) await once(out, 'drain');
      chunk = [];
    }
  }
  out.end(chunk.join(''));
  await once(out, 'finish');
  return written;
}
