/**
 * The dependency rules in .dependency-cruiser.cjs, proven to bite: a scratch tree with the
 * workspace's folder layout and path aliases gets one forbidden import per rule, and the cruiser
 * must name exactly the rule each one breaks, while the allowed imports beside them pass.
 */
import { execFile } from 'node:child_process';
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const repo = resolve(import.meta.dirname, '../..');
const cruiser = join(repo, 'node_modules/dependency-cruiser/bin/dependency-cruise.mjs');

interface Violation {
  from: string;
  to: string;
  rule: { name: string };
}

/** Runs the cruiser with the project's rules over `folders` of `root`, as `npm run lint` does. */
async function cruise(root: string, folders: string[]): Promise<{ violations: Violation[]; exitCode: number; text: string }> {
  const run = (outputType: string) =>
    promisify(execFile)(process.execPath, [cruiser, '--config', '.dependency-cruiser.cjs', '--output-type', outputType, ...folders], {
      cwd: root,
      // The JSON report of the whole workspace runs to a few megabytes; execFile's default cap is 1 MiB.
      maxBuffer: 64 * 1024 * 1024,
    }).then(
      (done) => ({ stdout: done.stdout, exitCode: 0 }),
      (failed: { stdout: string; code: number }) => ({ stdout: failed.stdout, exitCode: failed.code }),
    );
  const json = await run('json');
  const text = await run('err');
  const report = JSON.parse(json.stdout) as { summary: { violations: Violation[] } };
  return { violations: report.summary.violations, exitCode: text.exitCode, text: text.stdout };
}

describe('dependency rules', () => {
  let scratch: string;

  /** Writes `source` to `path` inside the scratch tree. */
  const write = (path: string, source: string) => {
    mkdirSync(dirname(join(scratch, path)), { recursive: true });
    writeFileSync(join(scratch, path), source);
  };

  beforeAll(() => {
    scratch = mkdtempSync(join(tmpdir(), 'lw-dependency-rules-'));
    cpSync(join(repo, '.dependency-cruiser.cjs'), join(scratch, '.dependency-cruiser.cjs'));
    symlinkSync(join(repo, 'node_modules'), join(scratch, 'node_modules'));
    // The real aliases, so that `@loadwright/<lib>` resolves in the scratch tree as it does in the workspace.
    const { compilerOptions } = JSON.parse(readFileSync(join(repo, 'tsconfig.json'), 'utf8')) as {
      compilerOptions: { paths: Record<string, string[]> };
    };
    write('tsconfig.json', JSON.stringify({ compilerOptions: { baseUrl: '.', paths: compilerOptions.paths } }));
    for (const lib of Object.values(compilerOptions.paths).map(([index]) => index!)) write(lib, 'export const here = 1;\n');
    write('apps/api/src/app.ts', "import { here } from '@loadwright/refits';\nexport const app = here;\n");
    write('jobs/refit.worker.ts', "import { here } from '@loadwright/refits';\nexport const worker = here;\n");
  });

  afterAll(() => rmSync(scratch, { recursive: true, force: true }));

  it('passes a tree whose imports follow the layers', async () => {
    const { violations, exitCode } = await cruise(scratch, ['libs', 'apps', 'jobs']);
    expect(violations).toEqual([]);
    expect(exitCode).toBe(0);
  });

  it('names the rule each forbidden import breaks, and fails the run', async () => {
    const broken: Array<[file: string, source: string, rule: string]> = [
      [
        'libs/forecasting/src/peek.ts',
        "import { here } from '@loadwright/db';\nexport const x = here;\n",
        'engine-imports-nothing-of-ours',
      ],
      ['libs/contracts/src/peek.ts', "import { format } from 'date-fns';\nexport const x = format;\n", 'contracts-import-only-zod'],
      ['libs/db/src/peek.ts', "import { here } from '@loadwright/forecasting';\nexport const x = here;\n", 'db-imports-only-contracts'],
      ['apps/web/src/peek.ts', "import { here } from '@loadwright/refits';\nexport const x = here;\n", 'web-imports-only-contracts'],
      ['apps/cli/src/peek.ts', "import { app } from '../../api/src/app';\nexport const x = app;\n", 'apps-never-import-each-other'],
      ['jobs/peek.worker.ts', "import { app } from '../apps/api/src/app';\nexport const x = app;\n", 'jobs-never-import-apps'],
      ['libs/refits/src/peek.ts', "import { app } from '../../../apps/api/src/app';\nexport const x = app;\n", 'libs-never-import-apps'],
      ['libs/series/src/peek.ts', "import { y } from '../../audit/src/peek';\nexport const x = () => y;\n", 'no-circular-libraries'],
      ['libs/audit/src/peek.ts', "import { x } from '../../series/src/peek';\nexport const y = x;\n", 'no-circular-libraries'],
    ];
    for (const [file, source] of broken) write(file, source);
    try {
      const { violations, exitCode, text } = await cruise(scratch, ['libs', 'apps', 'jobs']);
      // A cycle is reported once, from whichever of its modules the cruiser meets first.
      const cycle = broken.filter(([, , rule]) => rule === 'no-circular-libraries').map(([file]) => file);
      for (const [file, , rule] of broken) {
        const from = rule === 'no-circular-libraries' ? cycle : [file];
        expect(
          violations.some((v) => from.includes(v.from) && v.rule.name === rule),
          `${file} should break ${rule}`,
        ).toBe(true);
      }
      expect(new Set(violations.map((v) => v.rule.name))).toEqual(new Set(broken.map(([, , rule]) => rule)));
      expect(exitCode).not.toBe(0);
      expect(text).toContain('jobs-never-import-apps: jobs/peek.worker.ts → apps/api/src/app.ts');
    } finally {
      for (const [file] of broken) rmSync(join(scratch, file));
    }
  });

  it('holds for the workspace itself', async () => {
    const { violations } = await cruise(repo, ['libs', 'apps', 'jobs', 'scripts']);
    expect(violations).toEqual([]);
  });
});
