/** One CSV record: its fields and the 1-based line of the file where it starts. */
export interface CsvRecord {
  line: number;
  fields: string[];
}

/** A quoting error in the CSV text, with the line where it was found. */
export class CsvSyntaxError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(message);
    this.name = "CsvSyntaxError";
  }
}

/**
 * Splits CSV text into records (RFC 4180: comma separators, CRLF or LF line ends, fields in double
 * quotes may hold commas, line breaks and "" for a quote). A line end right before the end of the text
 * closes the last record and starts none. Yields records one at a time so large files stay cheap.
 */
export function* csvRecords(text: string): Generator<CsvRecord> {
  const n = text.length;
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  while (i < n) {
    const start = line;
    const fields: string[] = [];
    for (;;) {
      let field = "";
      if (text.charCodeAt(i) === 34) {
        i++;
        for (;;) {
          if (i >= n) throw new CsvSyntaxError(start, `Line ${start}: a quoted field is never closed.`);
          const q = text.indexOf('"', i);
          if (q < 0) throw new CsvSyntaxError(start, `Line ${start}: a quoted field is never closed.`);
          const chunk = text.slice(i, q);
          for (let k = chunk.indexOf("\n"); k >= 0; k = chunk.indexOf("\n", k + 1)) line++;
          field += chunk;
          if (text.charCodeAt(q + 1) === 34) {
            field += '"';
            i = q + 2;
          } else {
            i = q + 1;
            break;
          }
        }
        const c = text.charCodeAt(i);
        if (i < n && c !== 44 && c !== 10 && c !== 13) throw new CsvSyntaxError(line, `Line ${line}: text follows a closing quote; write a quote inside a field as "".`);
      } else {
        let j = i;
        while (j < n) {
          const c = text.charCodeAt(j);
          if (c === 44 || c === 10 || c === 13) break;
          j++;
        }
        field = text.slice(i, j);
        i = j;
      }
      fields.push(field);
      if (i < n && text.charCodeAt(i) === 44) {
        i++;
        continue;
      }
      break;
    }
    if (text.charCodeAt(i) === 13) i++;
    if (text.charCodeAt(i) === 10) i++;
    line++;
    yield { line: start, fields };
  }
}
