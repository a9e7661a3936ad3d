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

export interface JsonWithLines {
  value: unknown;
  /** 1-based line of each object key, by dotted path ("tokens.minLength"). */
  keyLines: Map<string, number>;
}

/**
 * Parses strict JSON (RFC 8259) and remembers the line of every key, so a settings error can
 * point at its line. Node's JSON.parse reports no position on many errors, hence this parser;
 * config files are small, so clarity beats speed here. Duplicate keys are refused: RFC 8259 §4
 * leaves their meaning open, and in a config file one of them is a mistake.
 */
export function parseJsonWithLines(text: string): JsonWithLines {
  const keyLines = new Map<string, number>();
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0;

  const lineCol = (at: number): [number, number] => {
    let line = 1;
    let lineStart = 0;
    for (let i = 0; i < at && i < text.length; i++) {
      if (text.charCodeAt(i) === 10) {
        line++;
        lineStart = i + 1;
      }
    }
    return [line, at - lineStart + 1];
  };
  const fail = (message: string, at = pos): never => {
    const [line, column] = lineCol(at);
    throw new JsonSyntaxError(message, line, column);
  };
  const skipSpace = (): void => {
    while (pos < text.length) {
      const c = text.charCodeAt(pos);
      if (c === 32 || c === 9 || c === 10 || c === 13) pos++;
      else break;
    }
  };
  const found = (): string => (pos >= text.length ? 'the end of the file' : `'${text[pos]}'`);

  const parseString = (): string => {
    const start = pos;
    pos++;
    while (pos < text.length) {
      const c = text.charCodeAt(pos);
      if (c === 34) {
        pos++;
        try {
          return JSON.parse(text.slice(start, pos)) as string;
        } catch {
          return fail('invalid escape or control character in a string', start);
        }
      }
      if (c === 92) pos += 2;
      else if (c === 10) return fail('a string runs past the end of its line (missing closing quote?)', start);
      else pos++;
    }
    return fail('a string is never closed', start);
  };

  const parseValue = (path: string): unknown => {
    skipSpace();
    const c = text[pos];
    if (c === '{') return parseObject(path);
    if (c === '[') return parseArray(path);
    if (c === '"') return parseString();
    const literal = /^(?:true|false|null|-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][-+]?\d+)?)/.exec(text.slice(pos, pos + 64));
    if (literal === null) return fail(`expected a value but found ${found()}`);
    pos += literal[0].length;
    return JSON.parse(literal[0]);
  };

  const parseObject = (path: string): Record<string, unknown> => {
    const out: Record<string, unknown> = {};
    pos++;
    skipSpace();
    if (text[pos] === '}') {
      pos++;
      return out;
    }
    for (;;) {
      skipSpace();
      if (text[pos] !== '"') return fail(`expected a key in double quotes but found ${found()}${text[pos] === '}' ? ' (trailing comma?)' : ''}`);
      const keyAt = pos;
      const key = parseString();
      const keyPath = path === '' ? key : `${path}.${key}`;
      if (Object.prototype.hasOwnProperty.call(out, key)) return fail(`duplicate key "${keyPath}"`, keyAt);
      keyLines.set(keyPath, lineCol(keyAt)[0]);
      skipSpace();
      if (text[pos] !== ':') return fail(`expected ':' after "${key}" but found ${found()}`);
      pos++;
      out[key] = parseValue(keyPath);
      skipSpace();
      if (text[pos] === ',') {
        pos++;
        continue;
      }
      if (text[pos] === '}') {
        pos++;
        return out;
      }
      return fail(`expected ',' or '}' but found ${found()}`);
    }
  };

  const parseArray = (path: string): unknown[] => {
    const out: unknown[] = [];
    pos++;
    skipSpace();
    if (text[pos] === ']') {
      pos++;
      return out;
    }
    for (;;) {
      out.push(parseValue(`${path}[${out.length}]`));
      skipSpace();
      if (text[pos] === ',') {
        pos++;
        skipSpace();
        if (text[pos] === ']') return fail("a trailing comma before ']'");
        continue;
      }
      if (text[pos] === ']') {
        pos++;
        return out;
      }
      return fail(`expected ',' or ']' but found ${found()}`);
    }
  };

  skipSpace();
  if (pos >= text.length) fail('the file is empty; write {} for all defaults');
  const value = parseValue('');
  skipSpace();
  if (pos < text.length) fail(`unexpected ${found()} after the end of the JSON value`);
  return { value, keyLines };
}
