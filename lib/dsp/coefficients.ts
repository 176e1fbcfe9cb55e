/**
 * Parser for filter coefficients pasted as text from numpy, Python, C or semicolon-separated rows.
 * Accepted: numbers in decimal or scientific notation with an optional f/F suffix (C float literals);
 * separators , ; whitespace and newlines; nesting with [] {} (); numpy `array(...)` with an optional
 * `dtype=...`; numpy-2 scalars `np.float64(x)`; a leading declaration such as
 * `static const float b[3] =` or `b =`; comments `//`, `/* *\/`, `#` and `%`.
 * Shape: one list of numbers, or rows (nested lists, `;`-separated rows, or — when the text has no
 * brackets — one row per line); `[[…]]` is one row, a final `;` ends a statement, and parentheses
 * around a single list (a call such as `array(...)`) add no level. Rows must have equal lengths; a
 * column of single numbers is a list.
 */

export class CoefficientParseError extends Error {
  constructor(
    message: string,
    /** 0-based character offset of the offending token in the pasted text. */
    readonly offset: number,
    /** 1-based line and column of the offending token. */
    readonly line: number,
    readonly column: number,
  ) {
    super(message);
    this.name = "CoefficientParseError";
  }
}

type Token =
  | { kind: "number"; value: number; offset: number }
  | { kind: "open" | "close"; char: string; offset: number }
  | { kind: "comma" | "semicolon" | "newline"; offset: number };

interface Node {
  offset: number;
  value: number | Node[];
}

const CLOSER: Record<string, string> = { "[": "]", "{": "}", "(": ")" };
const NUMBER = /[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?[fF]?/y;
const BAD_TOKEN = /[^\s,;[\]{}()]+/y;
/** What may stand before `=` in a pasted assignment: a name, type words, pointer stars, [sizes]. */
const DECLARATION = /^\s*[A-Za-z_][\w\s*]*(?:\[[^\]]*\]\s*)*$/;

export function parseCoefficientText(text: string): number[] | number[][] {
  const cleaned = blankDecorations(text);
  const tokens = tokenize(cleaned, text);
  const hasBrackets = tokens.some((t) => t.kind === "open");
  let pos = 0;
  const fail = (message: string, offset: number): never => {
    throw parseError(text, message, offset);
  };

  const parseList = (openToken: Token | undefined): Node => {
    const start = openToken?.offset ?? 0;
    const rows: Node[] = [];
    let row: Node[] = [];
    let rowStart = start;
    let afterComma = false;
    const endRow = (offset: number) => {
      if (row.length > 0) rows.push({ offset: rowStart, value: row });
      row = [];
      rowStart = offset;
    };
    while (pos < tokens.length) {
      const t = tokens[pos++];
      if (t.kind === "number") row.push({ offset: t.offset, value: t.value });
      else if (t.kind === "open") row.push(parseList(t));
      else if (t.kind === "close") {
        if (openToken?.kind !== "open" || CLOSER[openToken.char] !== t.char) {
          fail(`unexpected '${t.char}'`, t.offset);
        }
        return finish();
      } else if (t.kind === "semicolon") endRow(t.offset);
      else if (t.kind === "newline" && !hasBrackets && !afterComma) endRow(t.offset);
      if (t.kind !== "newline") afterComma = t.kind === "comma";
    }
    if (openToken?.kind === "open") fail(`'${openToken.char}' is never closed`, openToken.offset);
    return finish();

    function finish(): Node {
      endRow(start);
      if (rows.length !== 1) return { offset: start, value: rows };
      const [only] = rows;
      const items = only.value as Node[];
      const isCallWrapper = openToken?.kind === "open" && openToken.char === "(" && items.length === 1;
      return isCallWrapper && Array.isArray(items[0].value) ? items[0] : { offset: start, value: items };
    }
  };

  const tree = parseList(undefined);
  return shape(tree, text);
}

/** Replaces the accepted non-numeric decorations by spaces, keeping every offset unchanged. */
function blankDecorations(text: string): string {
  const blank = (s: string) => s.replace(/[^\n]/g, " ");
  const uncommented = text.replace(/\/\*[\s\S]*?\*\//g, blank).replace(/(\/\/|#|%)[^\n]*/g, blank);
  const equals = uncommented.indexOf("=");
  const declaration = equals >= 0 && DECLARATION.test(uncommented.slice(0, equals));
  const body = declaration ? blank(uncommented.slice(0, equals + 1)) + uncommented.slice(equals + 1) : uncommented;
  return body
    .replace(/,?\s*dtype\s*=\s*['"]?[\w.]+['"]?/g, blank)
    .replace(/\b(?:np\.|numpy\.)?float(?:16|32|64|128)?\s*\(([^()]*)\)/g, (m, inner: string) => {
      const at = m.indexOf("(") + 1;
      return blank(m.slice(0, at)) + inner + " ";
    })
    .replace(/\b(?:np\.|numpy\.)?array\s*(?=\()/g, blank);
}

function tokenize(cleaned: string, original: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < cleaned.length) {
    const ch = cleaned[i];
    if (ch === "\n") tokens.push({ kind: "newline", offset: i });
    else if (ch === ",") tokens.push({ kind: "comma", offset: i });
    else if (ch === ";") tokens.push({ kind: "semicolon", offset: i });
    else if (ch in CLOSER) tokens.push({ kind: "open", char: ch, offset: i });
    else if (ch === "]" || ch === "}" || ch === ")") tokens.push({ kind: "close", char: ch, offset: i });
    else if (!/\s/.test(ch)) {
      NUMBER.lastIndex = i;
      const m = NUMBER.exec(cleaned);
      const end = m ? i + m[0].length : i;
      if (!m || /[\w.]/.test(cleaned[end] ?? "")) {
        BAD_TOKEN.lastIndex = i;
        const bad = BAD_TOKEN.exec(cleaned)?.[0] ?? ch;
        const why = /^[+-]?(nan|inf(inity)?)$/i.test(bad)
          ? "coefficients must be finite numbers"
          : "expected a number, a separator (, ; space newline) or a bracket";
        throw parseError(original, `unexpected '${bad}': ${why}`, i);
      }
      const value = Number.parseFloat(m[0].replace(/[fF]$/, ""));
      if (!Number.isFinite(value)) {
        throw parseError(original, `'${m[0]}' is out of the double-precision range`, i);
      }
      tokens.push({ kind: "number", value, offset: i });
      i = end;
      continue;
    }
    i++;
  }
  return tokens;
}

/**
 * The implicit top level is dropped when it holds one list; further single-element wrappers are dropped
 * only while they hold rows (so `[[…]]` stays one row). Returns a list of numbers or equal-length rows.
 */
function shape(tree: Node, text: string): number[] | number[][] {
  const onlyList = (n: Node): Node | undefined => {
    const items = n.value as Node[];
    return items.length === 1 && Array.isArray(items[0].value) ? items[0] : undefined;
  };
  let node = onlyList(tree) ?? tree;
  for (let inner = onlyList(node); inner && (inner.value as Node[]).some((c) => Array.isArray(c.value)); inner = onlyList(node)) {
    node = inner;
  }
  const items = node.value as Node[];
  if (items.length === 0) throw parseError(text, "no numbers found", node.offset);
  if (items.every((n) => typeof n.value === "number")) return items.map((n) => n.value as number);
  const rows = items.map((r) => {
    if (typeof r.value === "number") {
      throw parseError(text, "a number sits beside rows; use either one list or rows of numbers", r.offset);
    }
    return r.value.map((c) => {
      if (typeof c.value !== "number") throw parseError(text, "lists nested more than two deep", c.offset);
      return c.value;
    });
  });
  const width = rows[0].length;
  rows.forEach((r, i) => {
    if (r.length !== width) {
      throw parseError(text, `row ${i + 1} has ${r.length} number(s) but row 1 has ${width}`, items[i].offset);
    }
  });
  return width === 1 ? rows.map((r) => r[0]) : rows;
}

function parseError(text: string, message: string, offset: number): CoefficientParseError {
  const before = text.slice(0, offset);
  const line = before.split("\n").length;
  const column = offset - (before.lastIndexOf("\n") + 1) + 1;
  return new CoefficientParseError(`${message} (line ${line}, column ${column})`, offset, line, column);
}
