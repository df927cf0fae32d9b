/** Builds the web app when its sources are newer than the last build, so `npm start` stays quick. */
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';

const repoRoot = resolve(import.meta.dirname, '..');
const sources = ['apps/web', 'libs/contracts', 'angular.json', 'package-lock.json'];
const builtIndex = resolve(repoRoot, 'dist/web/browser/index.html');

function newestModification(path: string): number {
  const stats = statSync(path);
  if (!stats.isDirectory()) return stats.mtimeMs;
  let newest = stats.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestModification(join(path, entry)));
  return newest;
}

/** True when there is no build or a source file changed after it. */
export function isWebBuildStale(): boolean {
  if (!existsSync(builtIndex)) return true;
  const built = statSync(builtIndex).mtimeMs;
  return sources.some((source) => {
    const path = resolve(repoRoot, source);
    return existsSync(path) && newestModification(path) > built;
  });
}

/** Runs the production build of the web app, streaming its output. */
export function buildWeb(): Promise<void> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [resolve(repoRoot, 'node_modules/@angular/cli/bin/ng.js'), 'build', 'web'], {
      cwd: repoRoot,
      stdio: 'inherit',
      env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
    });
    child.once('error', fail);
    child.once('exit', (code) =>
      code === 0 ? done() : fail(new Error(`The web build failed (exit code ${code}); its messages are above.`)),
    );
  });
}
