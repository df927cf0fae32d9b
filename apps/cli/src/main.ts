/**
 * Entry point of the `loadwright` command: wires process arguments, standard input and output to runCli.
 */
import { runCli } from './run-cli';

/** All of standard input as text, or null when it is a terminal (nothing piped). */
async function readStdin(): Promise<string | null> {
  if (process.stdin.isTTY) return null;
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString('utf8');
}

const outcome = await runCli(process.argv.slice(2), readStdin);
if (outcome.stdout) process.stdout.write(outcome.stdout);
if (outcome.stderr) process.stderr.write(outcome.stderr);
process.exitCode = outcome.exitCode;
