/**
 * `npm run bench [-- filter …]`: runs every benchmark module bench/<area>/<name>.ts that exports
 * `bench` (see bench/support/harness.ts), one after another, prints its table, notes and checks, and
 * writes bench/results/<name>.json. A filter keeps the modules whose "<area>/<name>" contains it
 * (e.g. `npm run bench -- engine` or `npm run bench -- nls-vs-r`). Exits 1 when a check fails.
 *
 * Benchmarks marked `onlyWhenNamed` (slow ones) run only when a filter selects them.
 * Only files whose source declares `export const bench` are imported: a stand-alone script in a
 * bench folder (run with its own arguments) has side effects on import and is listed as skipped.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { formatTable, writeResult, type Benchmark } from './support/harness';

/** Directories under bench/ that are not benchmark areas. */
const notAreas = new Set(['support', 'results', 'node_modules']);

/** "<area>/<name>.ts" of every candidate module, sorted. */
function discover(root: URL): string[] {
  const found: string[] = [];
  for (const area of readdirSync(root).sort()) {
    if (notAreas.has(area) || area.startsWith('.') || !statSync(new URL(area, root)).isDirectory()) continue;
    for (const file of readdirSync(new URL(`${area}/`, root)).sort()) {
      if (file.endsWith('.ts') && !file.endsWith('.spec.ts') && !file.endsWith('.d.ts')) found.push(`${area}/${file}`);
    }
  }
  return found;
}

async function main(): Promise<void> {
  const root = new URL('./', import.meta.url);
  const filters = process.argv.slice(2).filter((arg) => !arg.startsWith('-'));
  const modules = discover(root).filter((path) => filters.length === 0 || filters.some((filter) => path.includes(filter)));
  if (modules.length === 0) {
    console.log(`No benchmark matches ${filters.join(', ')}. Available: ${discover(root).join(', ')}`);
    process.exitCode = 1;
    return;
  }
  let failed = 0;
  for (const path of modules) {
    if (!/export\s+const\s+bench\b/.test(readFileSync(new URL(path, root), 'utf8'))) {
      console.log(`\n=== ${path}: skipped (a stand-alone script: it does not export \`bench\`)`);
      continue;
    }
    const loaded = (await import(pathToFileURL(new URL(path, root).pathname).href)) as { bench?: Benchmark };
    if (!loaded.bench) continue;
    const { bench } = loaded;
    if (bench.onlyWhenNamed && filters.length === 0) {
      console.log(`\n=== ${path}: skipped (slow; run it with \`npm run bench -- ${bench.name}\`)`);
      continue;
    }
    console.log(`\n=== ${path}: ${bench.description}`);
    const started = performance.now();
    const report = await bench.run();
    console.log(formatTable(report.rows));
    for (const note of report.notes) console.log(`  note: ${note}`);
    for (const check of report.checks) {
      console.log(`  ${check.passed ? 'PASS' : 'FAIL'}  ${check.name}: ${check.detail}`);
      if (!check.passed) failed++;
    }
    const file = writeResult(bench.name, report, {
      module: path,
      generatedUtc: new Date().toISOString(),
      node: process.version,
      wallSeconds: (performance.now() - started) / 1000,
    });
    console.log(`  results: ${file}`);
  }
  if (failed > 0) process.exitCode = 1;
}

await main();
