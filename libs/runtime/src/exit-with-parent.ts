/**
 * A process started by `npm start` stops when its parent goes, even if the parent was killed outright:
 * the parent holds our standard input open, and its end means the parent is gone.
 */
export function stopWithParent(stop: () => Promise<void>): void {
  if (process.env['LOADWRIGHT_SUPERVISED'] !== '1') return;
  process.stdin.once('end', () => void stop().finally(() => process.exit(0)));
  process.stdin.resume();
}
