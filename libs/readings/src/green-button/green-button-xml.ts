/**
 * Reads Green Button XML as it arrives, chunk by chunk, into the plain object tree the ESPI reader
 * walks (element names without namespace prefix, attributes as `@_name`, text as strings or `#text`).
 * A streaming tokenizer (htmlparser2 in XML mode) means the file is never held twice, and the checks
 * happen as the bytes come: a DTD is refused at its first line (so no entity can be declared, let alone
 * expanded), nesting deeper than any ESPI feed is refused at the element that goes too deep, and the
 * structure must be well formed (every element closed, in order, under one root).
 */
import { Parser } from 'htmlparser2';

/** The XML is unusable; the message says what and where. */
export class GreenButtonXmlError extends Error {
  override readonly name = 'GreenButtonXmlError';
  constructor(
    message: string,
    /** True when the XML is broken; false when it is well formed but refused (a DTD, absurd nesting). */
    readonly malformed = true,
  ) {
    super(message);
  }
}

/** ESPI feeds nest about 8 deep (feed, entry, content, IntervalBlock, IntervalReading, timePeriod, start); 32 leaves room for extensions. */
export const maxGreenButtonDepth = 32;

/** One element under construction. */
interface Frame {
  name: string;
  node: Record<string, unknown>;
  text: string;
  hasChildren: boolean;
  hasAttributes: boolean;
}

/** A push parser: `write` chunks of text in order, then `end` for the document. */
export interface XmlTreeReader {
  write(chunk: string): void;
  end(): Record<string, unknown>;
}

/**
 * A reader building the tree; `repeating` names always become arrays, other repeated names become
 * arrays from their second occurrence.
 * @throws GreenButtonXmlError (from write or end) on a DTD, too deep nesting or malformed XML.
 */
export function createXmlTreeReader(repeating: ReadonlySet<string>, maxDepth = maxGreenButtonDepth): XmlTreeReader {
  const root: Frame = { name: '#document', node: {}, text: '', hasChildren: false, hasAttributes: false };
  const stack: Frame[] = [root];
  let roots = 0;
  // Offsets of each line start, so an error can name line and column however the text was chunked.
  const lineStarts = [0];
  let consumed = 0;

  const position = (index: number) => {
    let low = 0;
    let high = lineStarts.length - 1;
    while (low < high) {
      const middle = (low + high + 1) >> 1;
      if (lineStarts[middle]! <= index) low = middle;
      else high = middle - 1;
    }
    return `line ${low + 1}, column ${index - lineStarts[low]! + 1}`;
  };
  const fail = (message: string, malformed = true): never => {
    throw new GreenButtonXmlError(`${message} (${position(parser.startIndex)})`, malformed);
  };

  const parser = new SelfClosingAwareParser(
    {
      onprocessinginstruction(name) {
        const lower = name.toLowerCase();
        if (lower === '!doctype')
          fail('The file declares a DTD (<!DOCTYPE …>). Green Button files have none and Loadwright reads none; remove it', false);
        if (lower.startsWith('!')) fail(`The file holds a markup declaration <${name}>, which Loadwright does not read`, false);
      },
      onopentag(qualifiedName, attributes) {
        if (stack.length > maxDepth)
          fail(`The XML nests elements more than ${maxDepth} deep; a Green Button feed nests about 8, so this is not one`, false);
        if (stack.length === 1 && ++roots > 1) fail('The XML has more than one root element');
        const frame: Frame = { name: localName(qualifiedName), node: {}, text: '', hasChildren: false, hasAttributes: false };
        for (const [name, value] of Object.entries(attributes)) {
          if (name === 'xmlns' || name.startsWith('xmlns:')) continue;
          frame.node[`@_${localName(name)}`] = value;
          frame.hasAttributes = true;
        }
        stack[stack.length - 1]!.hasChildren = true;
        stack.push(frame);
      },
      ontext(text) {
        if (stack.length === 1) {
          if (text.trim() !== '') fail('The XML has text outside its root element');
          return;
        }
        stack[stack.length - 1]!.text += text;
      },
      onclosetag(qualifiedName, isImplied) {
        // htmlparser2 marks both `<a/>` and an element left open by its parent's end tag as implied.
        if (isImplied && !parser.inSelfClosingTag) fail(`The element <${qualifiedName}> is not closed where its parent ends`);
        const frame = stack.pop()!;
        const parent = stack[stack.length - 1]!;
        const text = frame.text.trim();
        let value: unknown;
        if (!frame.hasChildren && !frame.hasAttributes) value = text;
        else {
          if (text !== '') frame.node['#text'] = text;
          value = frame.node;
        }
        // Element values are strings or objects, so an array here always holds repeated elements.
        const existing = parent.node[frame.name];
        if (existing === undefined) parent.node[frame.name] = repeating.has(frame.name) ? [value] : value;
        else if (Array.isArray(existing)) existing.push(value);
        else parent.node[frame.name] = [existing, value];
      },
    },
    { xmlMode: true, decodeEntities: true },
  );

  return {
    write(chunk) {
      for (let i = chunk.indexOf('\n'); i !== -1; i = chunk.indexOf('\n', i + 1)) lineStarts.push(consumed + i + 1);
      consumed += chunk.length;
      parser.write(chunk);
    },
    end() {
      const open = stack.length > 1 ? stack[stack.length - 1]!.name : null;
      if (open) {
        parser.startIndex = consumed;
        fail(`The file ends inside <${open}>: it was cut short, or an element is not closed`);
      }
      parser.end();
      if (roots === 0) throw new GreenButtonXmlError('The file holds no XML element.');
      return root.node;
    },
  };
}

/** The tokenizer's parser, telling a self-closing tag (`<link … />`) from an element its parent's end tag closed. */
class SelfClosingAwareParser extends Parser {
  inSelfClosingTag = false;
  override onselfclosingtag(endIndex: number): void {
    this.inSelfClosingTag = true;
    try {
      super.onselfclosingtag(endIndex);
    } finally {
      this.inSelfClosingTag = false;
    }
  }
}

/** `espi:IntervalBlock` → `IntervalBlock`. */
function localName(name: string): string {
  const colon = name.indexOf(':');
  return colon === -1 ? name : name.slice(colon + 1);
}
