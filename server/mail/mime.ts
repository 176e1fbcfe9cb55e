/** What the development mailbox shows of a received message. */
export interface ParsedMessage {
  subject: string;
  body: string;
}

/**
 * Reads a single-part text message as nodemailer writes it: unfolded headers (RFC 5322 §2.2.3),
 * encoded-word subjects (RFC 2047 §4, B and Q) and a quoted-printable or base64 body (RFC 2045
 * §6.7, §6.8). Multipart bodies are kept as they are (the raw message is stored beside them).
 */
export function parseMessage(raw: string): ParsedMessage {
  const split = raw.search(/\r?\n\r?\n/);
  const head = split < 0 ? raw : raw.slice(0, split);
  const rawBody = split < 0 ? "" : raw.slice(split).replace(/^\r?\n\r?\n/, "");
  const headers = new Map<string, string>();
  for (const line of head.replace(/\r?\n[ \t]+/g, " ").split(/\r?\n/)) {
    const colon = line.indexOf(":");
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  const encoding = (headers.get("content-transfer-encoding") ?? "7bit").toLowerCase();
  return { subject: decodeWords(headers.get("subject") ?? ""), body: decodeBody(rawBody, encoding).replace(/\r\n/g, "\n") };
}

function decodeBody(body: string, encoding: string): string {
  if (encoding === "base64") return Buffer.from(body.replace(/\s+/g, ""), "base64").toString("utf8");
  if (encoding === "quoted-printable") return decodeQuotedPrintable(body);
  return body;
}

/** RFC 2045 §6.7: soft line breaks `=\r\n` vanish, `=XX` is one octet; octets are UTF-8. */
export function decodeQuotedPrintable(text: string): string {
  const joined = text.replace(/=\r?\n/g, "");
  const bytes: number[] = [];
  for (let i = 0; i < joined.length; i++) {
    const hex = joined.slice(i + 1, i + 3);
    if (joined[i] === "=" && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else {
      bytes.push(...Buffer.from(joined[i], "utf8"));
    }
  }
  return Buffer.from(bytes).toString("utf8");
}

/** RFC 2047 encoded words `=?charset?B|Q?text?=`; whitespace between two encoded words is dropped (§6.2). */
export function decodeWords(value: string): string {
  return value
    .replace(/(\?=)\s+(=\?)/g, "$1$2")
    .replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_m, _charset: string, kind: string, text: string) =>
      kind.toUpperCase() === "B" ? Buffer.from(text, "base64").toString("utf8") : decodeQuotedPrintable(text.replace(/_/g, " ")),
    );
}
