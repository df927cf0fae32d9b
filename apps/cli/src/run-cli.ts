/**
 * Dispatches `loadwright <command> …` and maps failures to exit statuses: 2 with one line for bad
 * arguments or data (including a series the engine refuses), 1 for anything unexpected.
 */
import { ForecastingError } from '@loadwright/forecasting';
import { backtestCommand } from './backtest';
import type { Command } from './command-context';
import { fitCommand } from './fit';
import { forecastCommand } from './forecast';
import { InputError } from './input-error';
import { selectCommand } from './select';
import { usage } from './usage';

const commands: Record<string, Command> = { fit: fitCommand, forecast: forecastCommand, select: selectCommand, backtest: backtestCommand };

/** What the process should write and its exit status. */
export interface CliOutcome {
  /** 0 on success, 2 for bad input, 1 for an unexpected failure. */
  exitCode: number;
  /** The JSON result (or help text) to write to standard output. */
  stdout: string;
  /** The one-line message (or usage) to write to standard error. */
  stderr: string;
}

/** Runs one command line (argv without node and script) and reports what to print. */
export async function runCli(argv: string[], readStdin: () => Promise<string | null>): Promise<CliOutcome> {
  const [name, ...args] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    return { exitCode: name === undefined ? 2 : 0, stdout: name === undefined ? '' : usage, stderr: name === undefined ? usage : '' };
  }
  const command = commands[name];
  if (!command)
    return { exitCode: 2, stdout: '', stderr: `loadwright: unknown command "${name}"; expected fit, forecast, select or backtest\n` };
  try {
    const result = await command({ args, readStdin });
    return { exitCode: 0, stdout: `${JSON.stringify(result)}\n`, stderr: '' };
  } catch (error) {
    if (error instanceof InputError || error instanceof ForecastingError) {
      return { exitCode: 2, stdout: '', stderr: `loadwright ${name}: ${error.message.replace(/\s*\n\s*/g, ' ')}\n` };
    }
    return { exitCode: 1, stdout: '', stderr: `loadwright ${name}: unexpected failure: ${(error as Error).stack ?? String(error)}\n` };
  }
}
