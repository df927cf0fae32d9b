/** Reads, inside a page, whether the bundled fonts actually loaded and render. */
import type { Page } from 'playwright-core';

/** What the page reports about its bundled text font (icons are SVG, not a font). */
export interface FontReport {
  /** `document.fonts.check` for the text face. */
  readonly textFontReady: boolean;
  /** Families whose @font-face reached status "loaded" (check() alone is true for unknown families). */
  readonly loadedFamilies: string[];
  /** First family in the body's computed font stack. */
  readonly bodyFamily: string;
}

/** Waits for pending font loads, then reports. */
export async function readFonts(page: Page): Promise<FontReport> {
  return page.evaluate(async () => {
    await document.fonts.ready;
    const loadedFamilies: string[] = [];
    document.fonts.forEach((face) => {
      if (face.status === 'loaded') loadedFamilies.push(face.family.replace(/["']/g, ''));
    });
    return {
      textFontReady: document.fonts.check("16px 'Source Sans 3'"),
      loadedFamilies: [...new Set(loadedFamilies)],
      bodyFamily: getComputedStyle(document.body).fontFamily.split(',')[0]!.replace(/["']/g, '').trim(),
    };
  });
}
