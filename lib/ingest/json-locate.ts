// Finds where a JSON text stops being valid (the error path only: JSON.parse did the real work and failed,
// and not every V8 message says "at position N").

/** Offset of the first character at which `text` is not valid JSON, or -1 when it is valid. */
export function jsonErrorOffset(text: string): number {
  let i = 0;
  const n = text.length;
  const ws = () => {
    while (i < n) {
      const c = text.charCodeAt(i);
      if (c === 32 || c === 10 || c === 13 || c === 9) i++;
      else break;
    }
  };
  class Stop {
    constructor(readonly at: number) {}
  }
  const fail = (): never => {
    throw new Stop(i);
  };
  const str = () => {
    i++; // opening quote
    while (i < n) {
      const c = text.charCodeAt(i);
      if (c === 34) {
        i++;
        return;
      }
      if (c < 32) fail();
      if (c === 92) {
        i++;
        const e = text[i];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 1, i + 5))) fail();
          i += 5;
        } else if ('"\\/bfnrt'.includes(e ?? '#')) i++;
        else fail();
      } else i++;
    }
    fail();
  };
  const numRe = /-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/y;
  const value = (): void => {
    ws();
    if (i >= n) fail();
    const c = text[i];
    if (c === '{') {
      i++;
      ws();
      if (text[i] === '}') {
        i++;
        return;
      }
      for (;;) {
        ws();
        if (text[i] !== '"') fail();
        str();
        ws();
        if (text[i] !== ':') fail();
        i++;
        value();
        ws();
        if (text[i] === ',') i++;
        else if (text[i] === '}') {
          i++;
          return;
        } else fail();
      }
    } else if (c === '[') {
      i++;
      ws();
      if (text[i] === ']') {
        i++;
        return;
      }
      for (;;) {
        value();
        ws();
        if (text[i] === ',') i++;
        else if (text[i] === ']') {
          i++;
          return;
        } else fail();
      }
    } else if (c === '"') str();
    else if (text.startsWith('true', i)) i += 4;
    else if (text.startsWith('false', i)) i += 5;
    else if (text.startsWith('null', i)) i += 4;
    else {
      numRe.lastIndex = i;
      const m = numRe.exec(text);
      if (!m || m[0].length === 0) fail();
      i += m![0].length;
    }
  };
  try {
    value();
    ws();
    return i < n ? i : -1;
  } catch (e) {
    if (e instanceof Stop) return Math.min(e.at, n);
    throw e;
  }
}

/** 1-based line (counted from `firstLine`) and column of an offset. */
export function lineAndColumn(text: string, offset: number, firstLine = 1): { line: number; column: number } {
  let line = firstLine;
  let lineStart = 0;
  let k = text.indexOf('\n');
  while (k !== -1 && k < offset) {
    line++;
    lineStart = k + 1;
    k = text.indexOf('\n', k + 1);
  }
  return { line, column: offset - lineStart + 1 };
}
