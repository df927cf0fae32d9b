/**
 * Turns the command's input text into a series: a JSON array of numbers, or CSV with a header whose
 * `value` column (or only column) holds the series, an optional `timestamp` column and, when asked
 * for, a temperature column. Trailing CSV rows with an empty value but a temperature are the hours to
 * forecast: they carry the future temperatures.
 */
import { parse } from 'csv-parse/sync';
import { InputError } from './input-error';

/** The series read from the input, with its timestamps when the CSV had them. */
export interface InputSeries {
  /** The observed series. */
  values: Float64Array;
  /** Epoch milliseconds, one per value, when a `timestamp` column was present. */
  timestamps: Float64Array | null;
  /** Temperature for each value, when a temperature column was asked for. */
  temperature: Float64Array | null;
  /** Temperatures of the trailing rows without a value (the forecast hours), or null. */
  futureTemperature: Float64Array | null;
}

/** Parsing choices. */
export interface ParseOptions {
  /** Name of the CSV column holding temperatures. */
  temperatureColumn?: string;
}

/** Parses JSON (`[1, 2, …]`) or CSV text into a series; throws InputError naming the bad spot. */
export function parseSeries(text: string, source: string, options: ParseOptions = {}): InputSeries {
  const trimmed = text.trim();
  if (trimmed === '') throw new InputError(`${source} is empty: give a CSV with a header row or a JSON array of numbers`);
  if (trimmed.startsWith('[')) {
    if (options.temperatureColumn !== undefined) throw new InputError(`${source}: a temperature column needs CSV input with a header`);
    return parseJsonArray(trimmed, source);
  }
  return parseCsv(trimmed, source, options);
}

function parseJsonArray(text: string, source: string): InputSeries {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (error) {
    throw new InputError(`${source} is not valid JSON: ${(error as Error).message}`);
  }
  if (!Array.isArray(data)) throw new InputError(`${source} must be a JSON array of numbers`);
  const values = new Float64Array(data.length);
  data.forEach((v, i) => {
    if (typeof v !== 'number' || !Number.isFinite(v))
      throw new InputError(`${source}: element ${i} is ${JSON.stringify(v)}, not a finite number`);
    values[i] = v;
  });
  return { values, timestamps: null, temperature: null, futureTemperature: null };
}

function parseCsv(text: string, source: string, options: ParseOptions): InputSeries {
  let rows: string[][];
  try {
    rows = parse(text, { skip_empty_lines: true, trim: true, relax_column_count: false }) as string[][];
  } catch (error) {
    throw new InputError(`${source} is not valid CSV: ${(error as Error).message}`);
  }
  const [header, ...body] = rows;
  if (header.some((cell) => cell !== '' && Number.isFinite(Number(cell)))) {
    throw new InputError(
      `${source}: the first line (${header.join(', ')}) looks like data; CSV input needs a header row such as "timestamp,value"`,
    );
  }
  const names = header.map((h) => h.toLowerCase());
  let valueColumn = names.indexOf('value');
  if (valueColumn < 0) {
    const others = names.filter((name) => name !== 'timestamp');
    if (header.length !== 1 || others.length !== 1) {
      throw new InputError(
        `${source}: the header (${header.join(', ')}) has no "value" column; name the series column "value" or give a single column`,
      );
    }
    valueColumn = 0;
  }
  const timestampColumn = names.indexOf('timestamp');
  const temperatureColumn = options.temperatureColumn === undefined ? -1 : names.indexOf(options.temperatureColumn.toLowerCase());
  if (options.temperatureColumn !== undefined && temperatureColumn < 0) {
    throw new InputError(`${source}: no column "${options.temperatureColumn}" for --temperature-column (header: ${header.join(', ')})`);
  }
  // Rows at the end with an empty value are forecast hours (only meaningful with temperatures).
  let observed = body.length;
  if (temperatureColumn >= 0) while (observed > 0 && body[observed - 1][valueColumn] === '') observed--;
  const values = new Float64Array(observed);
  const timestamps = timestampColumn >= 0 ? new Float64Array(body.length) : null;
  const temperature = temperatureColumn >= 0 ? new Float64Array(body.length) : null;
  body.forEach((row, i) => {
    const line = i + 2;
    if (i < observed) {
      const cell = row[valueColumn];
      const value = cell === '' ? Number.NaN : Number(cell);
      if (!Number.isFinite(value)) throw new InputError(`${source}: line ${line} has value "${cell}", not a finite number`);
      values[i] = value;
    }
    if (timestamps) {
      const time = Date.parse(row[timestampColumn]);
      if (!Number.isFinite(time))
        throw new InputError(`${source}: line ${line} has timestamp "${row[timestampColumn]}", not an ISO 8601 date-time`);
      timestamps[i] = time;
    }
    if (temperature) {
      const cell = row[temperatureColumn];
      const value = cell === '' ? Number.NaN : Number(cell);
      if (!Number.isFinite(value)) throw new InputError(`${source}: line ${line} has temperature "${cell}", not a finite number`);
      temperature[i] = value;
    }
  });
  if (timestamps) {
    for (let i = 1; i < timestamps.length; i++) {
      if (!(timestamps[i] > timestamps[i - 1])) throw new InputError(`${source}: timestamps must increase; line ${i + 2} does not`);
    }
  }
  return {
    values,
    timestamps: timestamps ? timestamps.slice(0, observed) : null,
    temperature: temperature ? temperature.slice(0, observed) : null,
    futureTemperature: temperature && observed < body.length ? temperature.slice(observed) : null,
  };
}
