/**
 * First look at an uploaded file (its first 64 KiB): is it text in an encoding Loadwright reads, which
 * delimiter separates its fields, does it start with a header row, and what do its first rows hold.
 * The interval between readings is judged from windows spread through the whole file (interval-steps.ts).
 * A file that cannot be read gets one sentence saying why and what to do instead.
 */
import { open } from 'node:fs/promises';
import { parse } from 'csv-parse/sync';
import type { UploadLayout, UploadPreview } from '@loadwright/contracts';
import { countSteps, judgeInterval, sampleSteps, type StepCounts, type StepSampling } from './interval-steps';
import { parseTimestamp, slashedDateFields } from './parse-timestamp';

/** Bytes read for the first look. */
export const sniffBytes = 64 * 1024;

/** Data rows shown in the preview. */
export const previewRows = 20;

/** The outcome of a first look. */
export type SniffResult = { ok: true; layout: UploadLayout; preview: UploadPreview } | { ok: false; message: string };

/** How to read timestamps further into the file (UTF-8 only), with the steps of its first rows. */
type StepsSoFar = StepSampling & { steps: StepCounts };

/** Magic numbers of formats people send instead of CSV. */
const knownBinaries: Array<{ bytes: number[]; name: string }> = [
  { bytes: [0x50, 0x4b, 0x03, 0x04], name: 'a ZIP archive or an Excel workbook (.xlsx)' },
  { bytes: [0xd0, 0xcf, 0x11, 0xe0], name: 'an old Excel workbook (.xls)' },
  { bytes: [0x25, 0x50, 0x44, 0x46], name: 'a PDF document' },
  { bytes: [0x89, 0x50, 0x4e, 0x47], name: 'a PNG image' },
  { bytes: [0x1f, 0x8b], name: 'a gzip archive' },
  { bytes: [0xff, 0xd8, 0xff], name: 'a JPEG image' },
];

const saveAsCsv = 'Save it as CSV (UTF-8), comma-, semicolon- or tab-separated, and upload that.';

/** Looks at the start of the file at `path`. */
export async function sniffFile(path: string): Promise<SniffResult> {
  const handle = await open(path, 'r');
  try {
    const buffer = Buffer.alloc(sniffBytes);
    const { bytesRead } = await handle.read(buffer, 0, sniffBytes, 0);
    const stat = await handle.stat();
    const { result, sampling } = firstLook(buffer.subarray(0, bytesRead), bytesRead >= stat.size);
    if (!result.ok || !sampling || bytesRead >= stat.size) return result;
    // The first rows may start irregularly: judge the interval by steps seen through the whole file.
    const { steps, ...how } = sampling;
    const spread = await sampleSteps(handle, stat.size, bytesRead, how);
    for (const [minutes, count] of steps) spread.set(minutes, (spread.get(minutes) ?? 0) + count);
    return { ...result, layout: { ...result.layout, ...intervalFacts(spread) } };
  } finally {
    await handle.close();
  }
}

/** Looks at the first bytes of a file; `whole` says whether they are the entire file. Pure. */
export function sniffBytesOf(bytes: Buffer, whole: boolean): SniffResult {
  return firstLook(bytes, whole).result;
}

/** The first look, and how to sample timestamps further into the file. */
function firstLook(bytes: Buffer, whole: boolean): { result: SniffResult; sampling: StepsSoFar | null } {
  const refuse = (result: SniffResult) => ({ result, sampling: null });
  const looked = readHead(bytes, whole);
  return 'result' in looked ? looked : refuse(looked);
}

/** The first look proper: a refusal, or the result with its sampling. */
function readHead(bytes: Buffer, whole: boolean): SniffResult | { result: SniffResult; sampling: StepsSoFar | null } {
  if (bytes.length === 0) return { ok: false, message: 'The file is empty.' };
  for (const known of knownBinaries) {
    if (known.bytes.every((byte, i) => bytes[i] === byte))
      return { ok: false, message: `The file is ${known.name}, not CSV text. ${saveAsCsv}` };
  }
  const encoding = detectEncoding(bytes);
  const bomLength = encoding === 'utf-8' ? (hasUtf8Bom(bytes) ? 3 : 0) : 2;
  if (encoding === 'utf-8') {
    const nul = bytes.indexOf(0);
    if (nul >= 0) return { ok: false, message: `The file holds binary data (a zero byte at offset ${nul}), not CSV text. ${saveAsCsv}` };
    const bad = firstInvalidUtf8(bytes, whole);
    if (bad >= 0) {
      const row = countLines(bytes, bad);
      return {
        ok: false,
        message: `Row ${row} is not UTF-8 text (byte 0x${bytes[bad]!.toString(16).toUpperCase().padStart(2, '0')} at offset ${bad}); the file seems to use another encoding. Save it as CSV UTF-8 and upload that.`,
      };
    }
  }
  let text = new TextDecoder(encoding).decode(bytes.subarray(bomLength));
  if (!whole) text = text.slice(0, Math.max(0, text.lastIndexOf('\n')));
  const binaryControl = /[\u0000-\u0008\u000e-\u001f]/; // eslint-disable-line no-control-regex -- finding control characters is the point
  if (binaryControl.test(text)) {
    const at = text.search(binaryControl);
    return {
      ok: false,
      message: `Row ${text.slice(0, at).split('\n').length} holds control characters, so this is not CSV text. ${saveAsCsv}`,
    };
  }
  if (text.trim() === '') return { ok: false, message: 'The file holds no rows.' };
  const markup = markupMessage(text);
  if (markup) return { ok: false, message: markup };

  const delimiter = detectDelimiter(text);
  if (!delimiter.ok) return delimiter;
  let records: string[][];
  try {
    records = parse(text, {
      delimiter: delimiter.value,
      relax_column_count: true,
      skip_empty_lines: true,
      to_line: previewRows + 60,
    }) as string[][];
  } catch (error) {
    return { ok: false, message: csvErrorMessage(error) };
  }
  const first = records[0] ?? [];
  const hasHeader = !first.some((cell) => parseTimestamp(cell) !== null || parseTimestamp(cell, true) !== null);
  const columns = hasHeader ? first.map((name, i) => name.trim() || `column ${i + 1}`) : first.map((_, i) => `column ${i + 1}`);
  const seen = new Map<string, number>();
  for (const [i, name] of columns.entries()) {
    const earlier = seen.get(name.toLowerCase());
    if (earlier !== undefined)
      return { ok: false, message: `Row 1: columns ${earlier + 1} and ${i + 1} are both named "${name}"; give each column its own name.` };
    seen.set(name.toLowerCase(), i);
  }
  const rows = records.slice(hasHeader ? 1 : 0, (hasHeader ? 1 : 0) + previewRows);
  if (rows.length === 0) return { ok: false, message: 'The file has a header row but no data rows.' };
  const decimalSeparator = delimiter.value === ';' && rows.some((row) => row.some((cell) => /^-?\d+,\d+$/.test(cell.trim()))) ? ',' : '.';
  const sample = records.slice(hasHeader ? 1 : 0);
  const slashDateOrder = slashOrderOf(sample);
  const dayFirst = slashDateOrder === 'day-first';
  const stamps = rows.flatMap((row) => row.map((cell) => parseTimestamp(cell, dayFirst)).filter((stamp) => stamp !== null));
  const head = headSteps(sample, dayFirst);
  const result: SniffResult = {
    ok: true,
    layout: {
      encoding,
      delimiter: delimiter.value,
      hasHeader,
      columns,
      decimalSeparator,
      timestampsHaveOffset: stamps.length === 0 ? null : stamps.every((stamp) => stamp.kind === 'instant'),
      slashDateOrder,
      endOfDayStamps: sample.some((row) =>
        row.some((cell) => /(?:^|[T\s])24:00(?::00)?$/.test(cell.trim()) && parseTimestamp(cell, dayFirst)),
      ),
      ...intervalFacts(head?.steps ?? new Map()),
    },
    preview: { columns, rows },
  };
  return {
    result,
    sampling:
      head && encoding === 'utf-8' ? { delimiter: delimiter.value, timestampColumn: head.column, dayFirst, steps: head.steps } : null,
  };
}

/** The order slashed dates in the sampled rows must be read in, when some row decides it. */
function slashOrderOf(sample: readonly string[][]): UploadLayout['slashDateOrder'] {
  for (const row of sample) {
    for (const cell of row) {
      const fields = slashedDateFields(cell);
      if (fields && fields[1] > 12 && fields[0] <= 12) return 'month-first';
      if (fields && fields[0] > 12 && fields[1] <= 12) return 'day-first';
    }
  }
  return null;
}

/**
 * Steps between consecutive distinct times in the first rows, in the first column that holds
 * timestamps only; null when no column does.
 */
function headSteps(sample: readonly string[][], dayFirst: boolean): { column: number; steps: StepCounts } | null {
  const width = sample[0]?.length ?? 0;
  for (let column = 0; column < width; column++) {
    const times: number[] = [];
    let all = true;
    for (const row of sample) {
      const cell = row[column] ?? '';
      if (cell.trim() === '') continue;
      const stamp = parseTimestamp(cell, dayFirst);
      if (!stamp) {
        all = false;
        break;
      }
      times.push(stamp.kind === 'instant' ? stamp.ms : stamp.wallMs);
    }
    if (!all || times.length < 2) continue;
    return { column, steps: countSteps(times) };
  }
  return null;
}

/** The layout's interval facts from step counts. */
function intervalFacts(steps: StepCounts): Pick<UploadLayout, 'intervalMinutes' | 'mixedIntervals'> {
  const judged = judgeInterval(steps);
  return { intervalMinutes: judged.intervalMinutes, mixedIntervals: judged.mixed ? judged.otherIntervals : [] };
}

/** The refusal for XML or HTML text, naming the Green Button import for ESPI files; null for other text. */
function markupMessage(text: string): string | null {
  const start = text.trimStart().slice(0, 4096);
  if (!start.startsWith('<')) return null;
  if (/naesb\.org\/espi|<(?:\w+:)?(?:IntervalBlock|UsagePoint|ReadingType)\b/i.test(start))
    return 'The file is Green Button (ESPI) XML, not CSV: import it with "Green Button file" on the Uploads page, which reads its intervals and units.';
  return `The file is ${/^<(?:!doctype\s+)?html/i.test(start) ? 'an HTML page' : 'XML'}, not CSV text. ${saveAsCsv}`;
}

function hasUtf8Bom(bytes: Buffer): boolean {
  return bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf;
}

function detectEncoding(bytes: Buffer): UploadLayout['encoding'] {
  if (bytes[0] === 0xff && bytes[1] === 0xfe) return 'utf-16le';
  if (bytes[0] === 0xfe && bytes[1] === 0xff) return 'utf-16be';
  return 'utf-8';
}

/** Offset of the first byte that breaks UTF-8, or −1; a sequence cut by the end of a partial read is fine. */
export function firstInvalidUtf8(bytes: Uint8Array, whole: boolean): number {
  let i = 0;
  while (i < bytes.length) {
    const byte = bytes[i]!;
    const length =
      byte < 0x80 ? 1 : byte >= 0xc2 && byte <= 0xdf ? 2 : byte >= 0xe0 && byte <= 0xef ? 3 : byte >= 0xf0 && byte <= 0xf4 ? 4 : 0;
    if (length === 0) return i;
    if (i + length > bytes.length) return whole ? i : -1;
    for (let k = 1; k < length; k++) if ((bytes[i + k]! & 0xc0) !== 0x80) return i;
    i += length;
  }
  return -1;
}

function countLines(bytes: Buffer, upTo: number): number {
  let lines = 1;
  for (let i = 0; i < upTo; i++) if (bytes[i] === 0x0a) lines++;
  return lines;
}

/** The delimiter that splits the first lines into the same number (> 1) of fields. */
function detectDelimiter(text: string): { ok: true; value: UploadLayout['delimiter'] } | { ok: false; message: string } {
  const lines = text
    .split(/\r?\n/)
    .filter((line) => line.trim() !== '')
    .slice(0, 30);
  const score = (delimiter: string) => {
    const counts = lines.map((line) => splitOutsideQuotes(line, delimiter));
    const first = counts[0]!;
    return first > 1 ? counts.filter((count) => count === first).length * 100 + first : 0;
  };
  const candidates = [',', ';', '\t'] as const;
  const best = candidates.map((delimiter) => ({ delimiter, score: score(delimiter) })).sort((a, b) => b.score - a.score)[0]!;
  if (best.score > 0) return { ok: true, value: best.delimiter };
  const other = ['|', ':', ' '].find((candidate) => splitOutsideQuotes(lines[0]!, candidate) > 1);
  const hint = other ? ` This file seems to separate fields with "${other === ' ' ? 'space' : other}".` : '';
  return {
    ok: false,
    message: `Row 1 has a single column: Loadwright reads files whose fields are separated by comma, semicolon or tab.${hint} Export the file again with one of those.`,
  };
}

function splitOutsideQuotes(line: string, delimiter: string): number {
  let fields = 1;
  let quoted = false;
  for (const char of line) {
    if (char === '"') quoted = !quoted;
    else if (char === delimiter && !quoted) fields++;
  }
  return fields;
}

/** A csv-parse error as a sentence naming the row (and the column when known). */
export function csvErrorMessage(error: unknown, columns: readonly string[] = []): string {
  const e = error as { code?: string; lines?: number; record?: unknown[]; column?: number | string; message?: string };
  const row = e.lines ?? 0;
  const column = typeof e.column === 'number' && columns[e.column] ? `, column "${columns[e.column]}"` : '';
  switch (e.code) {
    case 'CSV_RECORD_INCONSISTENT_FIELDS_LENGTH':
    case 'CSV_RECORD_DONT_MATCH_COLUMNS_LENGTH': {
      const expected = /expect (\d+), got (\d+)/.exec(e.message ?? '');
      return expected
        ? `Row ${row} has ${expected[2]} fields where the header has ${expected[1]}; check that row for a stray delimiter or a missing cell.`
        : `Row ${row} has a different number of fields than the header; check that row for a stray delimiter or a missing cell.`;
    }
    case 'CSV_QUOTE_NOT_CLOSED':
      return `The file ends inside a quoted field (row ${row}): a quote (") opened in an earlier row is never closed.`;
    case 'INVALID_OPENING_QUOTE':
    case 'CSV_INVALID_CLOSING_QUOTE':
    case 'CSV_NON_TRIMABLE_CHAR_AFTER_CLOSING_QUOTE':
      return `Row ${row}${column}: a quote (") stands inside a field; quote the whole field and double the inner quote ("").`;
    default:
      return `Row ${row} cannot be read as CSV (${e.message ?? String(error)}).`;
  }
}
