/** Records every request a page makes that would leave the machine. */
import type { Page } from 'playwright-core';

/** Schemes that never touch the network. */
const localSchemes = new Set(['data:', 'blob:', 'about:']);

/** True when a URL stays on this machine's loopback address. */
export function staysOnLoopback(url: string): boolean {
  const parsed = new URL(url);
  return localSchemes.has(parsed.protocol) || parsed.hostname === '127.0.0.1';
}

/** Starts watching `page`; the returned arrays fill as requests are made. */
export function watchRequests(page: Page): { all: string[]; offMachine: string[] } {
  const all: string[] = [];
  const offMachine: string[] = [];
  page.on('request', (request) => {
    all.push(request.url());
    if (!staysOnLoopback(request.url())) offMachine.push(request.url());
  });
  return { all, offMachine };
}
