/** A run of a plain-text mail part: words, or a web address to show as a link. */
export type TextRun = { readonly kind: 'text'; readonly text: string } | { readonly kind: 'link'; readonly href: string };

/** http(s) addresses up to the next space or angle bracket; a trailing full stop or bracket stays text. */
const ADDRESS = /https?:\/\/[^\s<>"]+[^\s<>".,;:!?)\]]/g;

/** Splits a plain-text part into text and links, so invite links can be followed; nothing is ever parsed as HTML. */
export function textRuns(text: string): TextRun[] {
  const runs: TextRun[] = [];
  let at = 0;
  for (const match of text.matchAll(ADDRESS)) {
    if (match.index > at) runs.push({ kind: 'text', text: text.slice(at, match.index) });
    runs.push({ kind: 'link', href: match[0] });
    at = match.index + match[0].length;
  }
  if (at < text.length) runs.push({ kind: 'text', text: text.slice(at) });
  return runs;
}
