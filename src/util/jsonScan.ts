/**
 * A single pass over JSON text (RFC 8259 grammar) that finds what JSON.parse does not report on
 * every Node version: the offset of the first syntax error (Node 20's messages lose the position
 * for several errors) and a key repeated within one object (JSON.parse silently keeps the last).
 * Iterative, so deep nesting cannot overflow the stack.
 */
export type JsonScanProblem =
  | { kind: "syntax"; offset: number; message: string }
  | { kind: "duplicate"; offset: number; key: string; path: string };

interface Frame {
  type: "object" | "array";
  keys: Set<string>;
  /** Key (object) or index (array) of the value being read, for the path. */
  at: string | number;
}

const NUMBER = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;
const WS = /[ \t\n\r]*/y;

function pathOf(stack: Frame[]): string {
  let p = "";
  for (const f of stack) p += typeof f.at === "number" ? `[${f.at}]` : p === "" ? f.at : `.${f.at}`;
  return p === "" ? "(top level)" : p;
}

/** The first problem of the text, or undefined when it is valid JSON without repeated keys. */
export function scanJson(text: string): JsonScanProblem | undefined {
  let i = 0;
  const stack: Frame[] = [];
  const fail = (message: string): JsonScanProblem => ({ kind: "syntax", offset: i, message });
  const skip = (): void => {
    WS.lastIndex = i;
    WS.exec(text);
    i = WS.lastIndex;
  };
  const readString = (): string | undefined => {
    // text[i] === '"'
    let j = i + 1;
    let out = "";
    while (j < text.length) {
      const c = text.charCodeAt(j);
      if (c === 0x22) {
        i = j + 1;
        return out;
      }
      if (c < 0x20) {
        i = j;
        return undefined;
      }
      if (c === 0x5c) {
        const e = text[j + 1];
        if (e !== undefined && '"\\/bfnrt'.includes(e)) {
          out += e;
          j += 2;
          continue;
        }
        if (e === "u" && /^[0-9a-fA-F]{4}$/.test(text.slice(j + 2, j + 6))) {
          out += String.fromCharCode(parseInt(text.slice(j + 2, j + 6), 16));
          j += 6;
          continue;
        }
        i = j;
        return undefined;
      }
      out += text[j];
      j++;
    }
    i = j;
    return undefined;
  };
  /** After a value: close containers or expect the next element. Returns true when the text is done. */
  for (;;) {
    // Read one value.
    skip();
    const c = text[i];
    if (c === "{" || c === "[") {
      i++;
      skip();
      const frame: Frame = { type: c === "{" ? "object" : "array", keys: new Set(), at: 0 };
      if (text[i] === (c === "{" ? "}" : "]")) {
        i++;
      } else {
        stack.push(frame);
        if (frame.type === "object") {
          const p = readKey(frame);
          if (p !== undefined) return p;
        }
        continue;
      }
    } else if (c === '"') {
      if (readString() === undefined) return fail("bad character or escape in a string, or a string not closed");
    } else if (c !== undefined && (c === "-" || (c >= "0" && c <= "9"))) {
      NUMBER.lastIndex = i;
      if (NUMBER.exec(text) === null) return fail("malformed number");
      i = NUMBER.lastIndex;
    } else if (text.startsWith("true", i)) i += 4;
    else if (text.startsWith("false", i)) i += 5;
    else if (text.startsWith("null", i)) i += 4;
    else return fail(c === undefined ? "unexpected end of the text (a value is missing)" : `unexpected character ${JSON.stringify(c)} where a value should start`);
    // After a value: close containers, or a comma and the next element.
    for (;;) {
      skip();
      const top = stack[stack.length - 1];
      if (top === undefined) return i === text.length ? undefined : fail(`unexpected ${JSON.stringify(text[i])} after the end of the JSON value`);
      const close = top.type === "object" ? "}" : "]";
      if (text[i] === close) {
        i++;
        stack.pop();
        continue;
      }
      if (text[i] !== ",") return fail(text[i] === undefined ? `unexpected end of the text (expected "," or "${close}")` : `expected "," or "${close}", got ${JSON.stringify(text[i])}`);
      i++;
      if (top.type === "array") top.at = (top.at as number) + 1;
      else {
        const p = readKey(top);
        if (p !== undefined) return p;
      }
      break;
    }
  }

  /** Reads `"key":` of an object member (duplicates reported); leaves i at the value. */
  function readKey(frame: Frame): JsonScanProblem | undefined {
    skip();
    if (text[i] !== '"') return fail(text[i] === undefined ? "unexpected end of the text (expected a key)" : `expected a key in double quotes, got ${JSON.stringify(text[i])}`);
    const start = i;
    const key = readString();
    if (key === undefined) return fail("bad character or escape in a key, or a key not closed");
    if (frame.keys.has(key)) {
      frame.at = key;
      return { kind: "duplicate", offset: start, key, path: pathOf(stack.slice(0, -1)) };
    }
    frame.keys.add(key);
    frame.at = key;
    skip();
    if (text[i] !== ":") return fail(`expected ":" after the key ${JSON.stringify(key)}`);
    i++;
    return undefined;
  }
}

/** 1-based line and column of an offset. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  const before = text.slice(0, offset);
  const line = before.split("\n").length;
  return { line, column: offset - before.lastIndexOf("\n") };
}
