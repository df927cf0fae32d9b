/**
 * Test and benchmark support (not exported from the library): fits a model with the npm package
 * `arima` 0.2.8 (an Emscripten build of the C library ctsa) in a child process and parses what it
 * prints, as a second outside reference for the CSS fit.
 *
 * Conventions of that package (checked in its code; see also fixtures/reference/README.md point 10):
 * `method: 2` is CSS (0 is CSS-ML, 1 exact ML; its README numbers them differently); coefficients are
 * only printed with `verbose: true`, to 6 significant digits; its MA sign is the Box-Jenkins one
 * (x_t = … + e_t − θ e_{t−1}), so θ is negated here into R's convention. It traps ("memory access out
 * of bounds") on long series and is unusable in that process afterwards, hence the child process.
 * On some shorter series its optimiser diverges instead (reported as 'diverged').
 *
 * @throws nothing: a failed or trapped fit returns `{ ok: false, failure, message }`.
 */
import { spawnSync } from 'node:child_process';
import { createRequire } from 'node:module';

/** What the package reported, in R's sign convention. */
export type NpmArimaFit =
  { ok: true; ar: number[]; ma: number[]; mean: number; sigma2: number } | { ok: false; failure: NpmArimaFailure; message: string };

/**
 * How a fit failed: 'trap' — the WebAssembly runtime aborted (e.g. "memory access out of bounds",
 * "null function or function signature mismatch") or the series did not fit into the module's memory
 * (a RangeError "offset is out of bounds"), which happens on long series; 'diverged' — its
 * optimiser reported a non-finite objective and printed no coefficients; 'other' — anything else.
 */
export type NpmArimaFailure = 'trap' | 'diverged' | 'other';

const packagePath = createRequire(import.meta.url).resolve('arima');

// The package prints through a console.log it bound at load time, so the child just lets it print.
const childScript = `
const ARIMA = require(process.argv[1]);
const input = JSON.parse(require('fs').readFileSync(0, 'utf8'));
try {
  new ARIMA({ p: input.p, d: 0, q: input.q, method: input.method, verbose: true }).train(input.x);
} catch (error) {
  const trap = error instanceof RangeError || (typeof WebAssembly !== 'undefined' && error instanceof WebAssembly.RuntimeError);
  process.stdout.write((trap ? 'TRAP ' : 'FAILED ') + error.message + '\\n');
  process.exit(3);
}
`;

/** Fits ARMA(p, q) with the npm `arima` package (method 2 = CSS by default) in a child process. */
export function fitWithNpmArima(x: ArrayLike<number>, p: number, q: number, method = 2): NpmArimaFit {
  const run = spawnSync(process.execPath, ['-e', childScript, packagePath], {
    input: JSON.stringify({ x: Array.from(x), p, q, method }),
    encoding: 'utf8',
    timeout: 60_000,
  });
  const out = `${run.stdout ?? ''}${run.stderr ?? ''}`;
  if (run.status !== 0) {
    const last = out.trim().split('\n').pop() ?? `exit ${run.status}`;
    return { ok: false, failure: last.startsWith('TRAP ') ? 'trap' : 'other', message: last };
  }
  const number = (pattern: RegExp) => {
    const match = pattern.exec(out);
    return match ? Number(match[1]) : Number.NaN;
  };
  const ar = Array.from({ length: p }, (_, i) => number(new RegExp(`^AR${i + 1}\\s+(\\S+)`, 'm')));
  const ma = Array.from({ length: q }, (_, j) => -number(new RegExp(`^MA${j + 1}\\s+(\\S+)`, 'm')));
  const mean = number(/^MEAN\s+(\S+)/m);
  const sigma2 = number(/^SIGMA\^2\s+(\S+)/m);
  if ([...ar, ...ma, mean, sigma2].some((v) => !Number.isFinite(v))) {
    const diverged = /returns NaN|exceeds the maximum double/.test(out);
    return { ok: false, failure: diverged ? 'diverged' : 'other', message: out.trim().split('\n')[0].slice(0, 200) };
  }
  return { ok: true, ar, ma, mean, sigma2 };
}
