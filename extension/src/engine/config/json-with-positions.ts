import { createScanner, findNodeAtLocation, getNodeValue, parseTree, SyntaxKind, type Node, type ParseError, ParseErrorCode } from 'jsonc-parser';

/** A JSON syntax error with the 1-based line and column where it was found. */
export class JsonSyntaxError extends Error {
  constructor(
    message: string,
    readonly line: number,
    readonly column: number,
  ) {
    super(message);
    this.name = 'JsonSyntaxError';
  }
}

export interface JsonWithPositions {
  value: unknown;
  /** 1-based line of the key (for an object member) or of the value (for a list item) at `path`. */
  lineOf(path: ReadonlyArray<string | number>): number | null;
}

/**
 * A config needs a few levels; deeper nesting is a mistake or an attack, and the recursive
 * parser would overflow the stack long before 10,000 levels.
 */
export const MAX_NESTING = 32;

/**
 * Parses JSON with comments (jsonc-parser, the parser VS Code uses for its own settings) and
 * keeps the offset of every node, so a settings error can point at its line. A UTF-8 BOM is
 * accepted. Trailing commas are refused (VS Code flags them in a .json file), and so are
 * duplicate keys: RFC 8259 §4 leaves their meaning open, and in a config one of them is a mistake.
 */
export function parseJsonWithPositions(source: string): JsonWithPositions {
  // A space keeps every offset where it was.
  const text = source.charCodeAt(0) === 0xfeff ? ' ' + source.slice(1) : source;
  const lines = lineStarts(text);
  const position = (offset: number): [number, number] => {
    let lo = 0;
    let hi = lines.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (lines[mid]! <= offset) lo = mid;
      else hi = mid - 1;
    }
    return [lo + 1, offset - lines[lo]! + 1];
  };
  const fail = (message: string, offset: number): never => {
    const [line, column] = position(offset);
    throw new JsonSyntaxError(message, line, column);
  };

  if (text.trim() === '') fail('the file is empty; write {} for all defaults', 0);
  checkNesting(text, fail);
  const errors: ParseError[] = [];
  const root = parseTree(text, errors, { allowTrailingComma: false, disallowComments: false, allowEmptyContent: false });
  if (errors.length > 0) {
    const first = errors[0]!;
    fail(syntaxMessage(first, text), first.offset);
  }
  if (root === undefined) return fail('no JSON value found', 0);
  checkDuplicateKeys(root, text, fail);

  return {
    value: getNodeValue(root),
    lineOf(path) {
      const node = findNodeAtLocation(root, [...path]);
      if (node === undefined) return null;
      // An object member's value: report its key's line, where the reader looks.
      const at = node.parent?.type === 'property' ? node.parent.offset : node.offset;
      return position(at)[0];
    },
  };
}

function lineStarts(text: string): number[] {
  const out = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10 || (c === 13 && text.charCodeAt(i + 1) !== 10)) out.push(i + 1);
  }
  return out;
}

/** One pass of the (iterative) scanner, before the (recursive) parser sees deep input. */
function checkNesting(text: string, fail: (message: string, offset: number) => never): void {
  const scanner = createScanner(text, true);
  let depth = 0;
  for (let kind = scanner.scan(); kind !== SyntaxKind.EOF; kind = scanner.scan()) {
    if (kind === SyntaxKind.OpenBraceToken || kind === SyntaxKind.OpenBracketToken) {
      if (++depth > MAX_NESTING) fail(`nested more than ${MAX_NESTING} levels deep; loudword.json needs at most 3`, scanner.getTokenOffset());
    } else if (kind === SyntaxKind.CloseBraceToken || kind === SyntaxKind.CloseBracketToken) depth--;
  }
}

function checkDuplicateKeys(node: Node, text: string, fail: (message: string, offset: number) => never, path = ''): void {
  if (node.type === 'object') {
    const seen = new Set<string>();
    for (const member of node.children ?? []) {
      const [keyNode, valueNode] = member.children ?? [];
      if (keyNode === undefined) continue;
      const key = String(keyNode.value);
      const keyPath = path === '' ? key : `${path}.${key}`;
      if (seen.has(key)) fail(`duplicate key "${keyPath}"`, keyNode.offset);
      seen.add(key);
      if (valueNode !== undefined) checkDuplicateKeys(valueNode, text, fail, keyPath);
    }
  } else if (node.type === 'array') {
    (node.children ?? []).forEach((item, i) => checkDuplicateKeys(item, text, fail, `${path}[${i}]`));
  }
}

function syntaxMessage(error: ParseError, text: string): string {
  const found = error.offset >= text.length ? 'the end of the file' : `'${text[error.offset]}'`;
  const trailingComma = /^[}\]]/.test(text.slice(error.offset)) && /,\s*$/.test(text.slice(0, error.offset).replace(/\/\/[^\n]*$/gm, ''));
  switch (error.error) {
    case ParseErrorCode.PropertyNameExpected:
      return `expected a key in double quotes but found ${found}${trailingComma ? ' (trailing comma?)' : ''}`;
    case ParseErrorCode.ValueExpected:
      return `expected a value but found ${found}${trailingComma ? ' (trailing comma?)' : ''}`;
    case ParseErrorCode.ColonExpected:
      return `expected ':' after a key but found ${found}`;
    case ParseErrorCode.CommaExpected:
      return `expected ',' or a closing bracket but found ${found}`;
    case ParseErrorCode.CloseBraceExpected:
      return `expected ',' or '}' but found ${found}`;
    case ParseErrorCode.CloseBracketExpected:
      return `expected ',' or ']' but found ${found}`;
    case ParseErrorCode.EndOfFileExpected:
      return `unexpected ${found} after the end of the JSON value`;
    case ParseErrorCode.UnexpectedEndOfString:
      return 'a string runs past the end of its line (missing closing quote?)';
    case ParseErrorCode.UnexpectedEndOfComment:
      return 'a /* comment is never closed';
    case ParseErrorCode.InvalidEscapeCharacter:
    case ParseErrorCode.InvalidUnicode:
      return 'invalid escape in a string';
    case ParseErrorCode.InvalidCharacter:
      return 'a control character inside a string (escape it, e.g. \\t)';
    case ParseErrorCode.InvalidNumberFormat:
    case ParseErrorCode.UnexpectedEndOfNumber:
      return 'a number is not written as JSON numbers are';
    default:
      return `unexpected ${found}`;
  }
}
