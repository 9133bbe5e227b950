/**
 * Stock-list files must be UTF-8 (with or without a byte-order mark). Anything else is refused with
 * that reason and where the first offending byte is, rather than read as garbage.
 */

/** Why a file is not UTF-8 text, and where. */
export interface EncodingProblem {
  message: string;
  /** 0-based offset of the first byte that is not UTF-8. */
  offset: number;
  /** 1-based line (counting line feeds) of that byte. */
  line: number;
}

/** The result of {@link decodeUtf8File}. */
export type DecodedText = { ok: true; text: string } | { ok: false; problem: EncodingProblem };

/**
 * Decodes `bytes` as UTF-8 with `TextDecoder('utf-8', {fatal: true})` (WHATWG Encoding Standard),
 * dropping a leading byte-order mark. A UTF-16 byte-order mark or an invalid sequence gives a problem
 * naming the byte and its line.
 */
export function decodeUtf8File(bytes: Uint8Array): DecodedText {
  if (bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))) {
    return {
      ok: false,
      problem: {
        message: 'The file is UTF-16 text, not UTF-8: save it again as "CSV UTF-8" and upload that.',
        offset: 0,
        line: 1,
      },
    };
  }
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    // U+0000 is valid UTF-8 but never text in a stock list (and PostgreSQL cannot store it): a file
    // with one is UTF-16 without its byte-order mark, or not a text file at all.
    const nul = bytes.indexOf(0);
    if (nul >= 0) {
      let line = 1;
      let lineStart = 0;
      for (let i = 0; i < nul; i += 1) {
        if (bytes[i] === 0x0a) {
          line += 1;
          lineStart = i + 1;
        }
      }
      const column = new TextDecoder('utf-8').decode(bytes.subarray(lineStart, nul)).length + 1;
      return {
        ok: false,
        problem: {
          message:
            `The file holds a NUL character (byte 0x00) on line ${line}, column ${column} (offset ${nul}): a stock list is plain text, ` +
            'so this is UTF-16 text without its byte-order mark or not a text file. Save it again as "CSV UTF-8" and upload that.',
          offset: nul,
          line,
        },
      };
    }
    return { ok: true, text };
  } catch {
    const offset = firstInvalidUtf8Offset(bytes);
    let line = 1;
    for (let i = 0; i < offset; i += 1) if (bytes[i] === 0x0a) line += 1;
    const byte = bytes[offset] ?? 0;
    return {
      ok: false,
      problem: {
        message:
          `The file is not UTF-8 text: byte 0x${byte.toString(16).toUpperCase().padStart(2, '0')} on line ${line} ` +
          '(offset ' + offset + ') is not valid UTF-8; it looks like another encoding such as Windows-1252 or ISO-8859-1. ' +
          'Save the file again as "CSV UTF-8" and upload that.',
        offset,
        line,
      },
    };
  }
}

/**
 * Offset of the first byte that breaks UTF-8 (RFC 3629 section 4: no overlongs, no surrogates,
 * nothing above U+10FFFF), or `bytes.length` when there is none.
 */
export function firstInvalidUtf8Offset(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const b = bytes[i];
    if (b < 0x80) {
      i += 1;
      continue;
    }
    const lead = leadByteRule(b);
    if (!lead) return i;
    const { need, min, max } = lead;
    for (let k = 1; k <= need; k += 1) {
      const c = bytes[i + k];
      const lo = k === 1 ? min : 0x80;
      const hi = k === 1 ? max : 0xbf;
      if (c === undefined || c < lo || c > hi) return i;
    }
    i += need + 1;
  }
  return bytes.length;
}

/** For a lead byte: how many continuation bytes follow and the range of the first (RFC 3629 table). */
function leadByteRule(b: number): { need: number; min: number; max: number } | null {
  if (b >= 0xc2 && b <= 0xdf) return { need: 1, min: 0x80, max: 0xbf };
  if (b === 0xe0) return { need: 2, min: 0xa0, max: 0xbf };
  if (b === 0xed) return { need: 2, min: 0x80, max: 0x9f };
  if (b >= 0xe1 && b <= 0xef) return { need: 2, min: 0x80, max: 0xbf };
  if (b === 0xf0) return { need: 3, min: 0x90, max: 0xbf };
  if (b >= 0xf1 && b <= 0xf3) return { need: 3, min: 0x80, max: 0xbf };
  if (b === 0xf4) return { need: 3, min: 0x80, max: 0x8f };
  return null;
}
