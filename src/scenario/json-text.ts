import { ScenarioError } from './errors.js';

/**
 * Reads JSON text, and on a syntax error says where (line and column) and what was expected.
 * Engines word and place their JSON errors differently (some give no position at all), so the
 * position comes from a small scanner of our own that runs only after JSON.parse has failed.
 */
export function parseJsonText(text: string, label: string): unknown {
  const body = text.replace(/^\uFEFF/, '');
  try {
    return JSON.parse(body) as unknown;
  } catch (error) {
    const found = findJsonError(body);
    const where = found === undefined ? undefined : lineAndColumn(body, found.offset);
    const message =
      found === undefined || where === undefined
        ? `not valid JSON: ${error instanceof Error ? error.message : String(error)}`
        : `line ${where.line}, column ${where.column}: ${found.message}`;
    throw new ScenarioError([{ path: label, message }], 'The scenario file is not valid JSON');
  }
}

export interface JsonSyntaxError {
  /** Index into the text (UTF-16 code units). */
  offset: number;
  message: string;
}

/** 1-based line and column of an offset; a CRLF counts as one line break. */
export function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text[i] === '\n') {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

const MAX_DEPTH = 512;
const NUMBER = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;

class JsonSyntax extends Error {
  constructor(
    readonly offset: number,
    message: string,
  ) {
    super(message);
  }
}

/** The first syntax error in `text` per RFC 8259, or undefined if the text is valid JSON. */
export function findJsonError(text: string): JsonSyntaxError | undefined {
  let i = 0;
  const fail = (message: string, at = i): never => {
    throw new JsonSyntax(at, message);
  };
  const skipSpace = (): void => {
    while (i < text.length && ' \t\n\r'.includes(text[i]!)) i++;
  };
  const describeHere = (): string => (i >= text.length ? 'the end of the file' : `'${text[i]}'`);

  const value = (depth: number): void => {
    if (depth > MAX_DEPTH) fail('nested too deeply');
    skipSpace();
    const c = text[i];
    if (c === '{') return object(depth);
    if (c === '[') return array(depth);
    if (c === '"') return string();
    if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) return number();
    for (const word of ['true', 'false', 'null']) {
      if (text.startsWith(word, i)) {
        i += word.length;
        return;
      }
    }
    if (c === "'") fail('text must be in double quotes, not single quotes');
    if (c === '/') fail('comments are not allowed in JSON');
    if (text.startsWith('NaN', i) || text.startsWith('Infinity', i)) fail('NaN and Infinity are not JSON numbers; give a number');
    fail(`expected a value, found ${describeHere()}`);
  };

  const object = (depth: number): void => {
    i++; // {
    skipSpace();
    if (text[i] === '}') {
      i++;
      return;
    }
    for (;;) {
      skipSpace();
      if (text[i] === '}') fail("a comma before '}' is not allowed in JSON");
      if (text[i] !== '"') fail(`expected a field name in double quotes, found ${describeHere()}`);
      string();
      skipSpace();
      if (text[i] !== ':') fail(`expected ':' after the field name, found ${describeHere()}`);
      i++;
      value(depth + 1);
      skipSpace();
      if (text[i] === ',') {
        i++;
        continue;
      }
      if (text[i] === '}') {
        i++;
        return;
      }
      fail(`expected ',' or '}' after a value, found ${describeHere()}`);
    }
  };

  const array = (depth: number): void => {
    i++; // [
    skipSpace();
    if (text[i] === ']') {
      i++;
      return;
    }
    for (;;) {
      skipSpace();
      if (text[i] === ']') fail("a comma before ']' is not allowed in JSON");
      value(depth + 1);
      skipSpace();
      if (text[i] === ',') {
        i++;
        continue;
      }
      if (text[i] === ']') {
        i++;
        return;
      }
      fail(`expected ',' or ']' after a value, found ${describeHere()}`);
    }
  };

  const string = (): void => {
    const start = i;
    i++; // opening quote
    while (i < text.length) {
      const c = text[i]!;
      if (c === '"') {
        i++;
        return;
      }
      if (c === '\\') {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) fail('\\u must be followed by 4 hex digits');
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) {
          i += 2;
        } else {
          fail(`'\\${e ?? ''}' is not a JSON escape`);
        }
        continue;
      }
      if (c < ' ') fail('a line break or control character inside text; write it as \\n or \\t');
      i++;
    }
    fail('the text that starts here has no closing double quote', start);
  };

  const number = (): void => {
    NUMBER.lastIndex = i;
    const match = NUMBER.exec(text);
    if (match === null) fail(`${describeHere()} does not start a valid number`);
    i += match![0].length;
  };

  try {
    value(0);
    skipSpace();
    if (i < text.length) fail(`unexpected ${describeHere()} after the end of the JSON value`);
    return undefined;
  } catch (error) {
    if (error instanceof JsonSyntax) return { offset: error.offset, message: error.message };
    throw error;
  }
}
