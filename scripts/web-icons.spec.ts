/**
 * The web app ships only the icons it shows, as bundled SVG: no template may fall back to an icon
 * font ligature (`<mat-icon>name</mat-icon>`), and every icon name a template or an `icon:` field
 * uses must be in the icon set, or it would render as an empty square.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const appRoot = fileURLToPath(new URL('../apps/web/src/app', import.meta.url));

/** Every template and component source of the web app (specs left out). */
function sources(folder = appRoot): { path: string; text: string }[] {
  return readdirSync(folder, { withFileTypes: true }).flatMap((entry) => {
    const path = join(folder, entry.name);
    if (entry.isDirectory()) return sources(path);
    if (!/\.(html|ts)$/.test(entry.name) || entry.name.endsWith('.spec.ts')) return [];
    return [{ path, text: readFileSync(path, 'utf8') }];
  });
}

/** The names the icon set registers: the Material Symbols files it imports. */
function registeredNames(): Set<string> {
  const text = readFileSync(join(appRoot, 'core/icons/icon-set.ts'), 'utf8');
  return new Set([...text.matchAll(/from '@material-symbols\/svg-400\/outlined\/([a-z0-9_]+)\.svg'/g)].map((match) => match[1]!));
}

/** Icon names a source asks for: svgIcon="x", [svgIcon]="… 'x' …" results, icon: 'x' and icon="x". */
function usedNames(text: string): string[] {
  const names = [...text.matchAll(/\bsvgIcon="([a-z0-9_]+)"/g)].map((match) => match[1]!);
  for (const [, expression] of text.matchAll(/\[svgIcon\]="([^"]*)"/g)) {
    // Literals compared against (status === 'done') are not icon names; the ternary's results are.
    names.push(...[...expression!.matchAll(/(?<!===?\s*)'([a-z0-9_]+)'/g)].map((match) => match[1]!));
  }
  names.push(...[...text.matchAll(/\bicon: '([a-z0-9_]+)'/g)].map((match) => match[1]!));
  names.push(...[...text.matchAll(/\bicon="([a-z0-9_]+)"/g)].map((match) => match[1]!));
  return names;
}

describe('web icons', () => {
  it('uses no icon font ligature anywhere', () => {
    const ligatures = sources().flatMap(({ path, text }) =>
      [...text.matchAll(/<mat-icon\b[^>]*>\s*([^<\s][^<]*?)\s*<\/mat-icon/g)].map((match) => `${path}: ${match[1]}`),
    );
    expect(ligatures).toEqual([]);
  });

  it('registers every icon name the templates and components use', () => {
    const registered = registeredNames();
    const missing = sources()
      .filter(({ path }) => !path.endsWith('icon-set.ts'))
      .flatMap(({ path, text }) => usedNames(text).flatMap((name) => (registered.has(name) ? [] : [`${path}: ${name}`])));
    expect(missing).toEqual([]);
    // The set is what the screens show, not the whole font: a handful of dozens, not thousands.
    expect(registered.size).toBeGreaterThan(30);
    expect(registered.size).toBeLessThan(100);
  });
});
