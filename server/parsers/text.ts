// Byte-level checks and line splitting shared by every text format: size, binary content, UTF-8
// validity (with the line of the first bad byte), byte-order marks, and a cap on line length.
import type { FileError } from '../../shared/schemas/cast';

export const MAX_LINE_LENGTH = 65_536; // characters; no real cast line comes near this
export const MAX_COLUMNS = 512;

export function fileError(
  file: string,
  line: number | null,
  column: number | null,
  code: string,
  message: string,
): FileError {
  return { file, line, column, code, message };
}

/** Thrown inside a parser to abandon the file; parseUpload turns it into ok:false. */
export class ParseFailure extends Error {
  constructor(
    public readonly errors: FileError[],
    public readonly unmappedHeaders?: { file: string; headers: string[] },
  ) {
    super(errors[0]?.message ?? 'parse failure');
  }
}

/** Byte offset of the first invalid UTF-8 sequence, or -1 when the buffer is valid UTF-8. */
export function firstInvalidUtf8(b: Uint8Array): number {
  const n = b.length;
  let i = 0;
  while (i < n) {
    const c = b[i];
    if (c < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let min: number;
    if (c >= 0xc2 && c <= 0xdf) {
      need = 1;
      min = 0x80;
    } else if (c >= 0xe0 && c <= 0xef) {
      need = 2;
      min = 0x800;
    } else if (c >= 0xf0 && c <= 0xf4) {
      need = 3;
      min = 0x10000;
    } else return i;
    if (i + need >= n) return i; // a sequence cut off by the end of the file
    let cp = c & (need === 1 ? 0x1f : need === 2 ? 0x0f : 0x07);
    for (let k = 1; k <= need; k++) {
      const d = b[i + k];
      if (d === undefined || (d & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (d & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += need + 1;
  }
  return -1;
}

function lineOfOffset(b: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset && i < b.length; i++) if (b[i] === 0x0a) line++;
  return line;
}

export type Decoded = { text: string; encoding: 'utf-8' | 'utf-8-bom' | 'utf-16le' | 'utf-16be' };

/** Decode a text upload or throw ParseFailure naming what is wrong with its bytes. */
export function decodeText(file: string, bytes: Uint8Array): Decoded {
  if (bytes.length === 0) throw new ParseFailure([fileError(file, null, null, 'empty_file', 'the file is empty')]);
  let text: string;
  let encoding: Decoded['encoding'] = 'utf-8';
  if (bytes[0] === 0xff && bytes[1] === 0xfe) {
    text = new TextDecoder('utf-16le').decode(bytes.subarray(2));
    encoding = 'utf-16le';
  } else if (bytes[0] === 0xfe && bytes[1] === 0xff) {
    text = new TextDecoder('utf-16be').decode(bytes.subarray(2));
    encoding = 'utf-16be';
  } else {
    let body = bytes;
    if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) {
      body = bytes.subarray(3);
      encoding = 'utf-8-bom';
    }
    const nul = body.indexOf(0);
    if (nul >= 0)
      throw new ParseFailure([
        fileError(
          file,
          lineOfOffset(body, nul),
          null,
          'binary',
          `the file holds binary data (a NUL byte at byte ${nul + 1}); expected text`,
        ),
      ]);
    const bad = firstInvalidUtf8(body);
    if (bad >= 0)
      throw new ParseFailure([
        fileError(
          file,
          lineOfOffset(body, bad),
          null,
          'invalid_utf8',
          `the file is not valid UTF-8 text (bad byte 0x${body[bad].toString(16).padStart(2, '0')} at byte ${bad + 1}); save it as UTF-8`,
        ),
      ]);
    text = new TextDecoder('utf-8').decode(body);
  }
  if (text.includes('\u0000'))
    throw new ParseFailure([
      fileError(file, null, null, 'binary', 'the file holds binary data (NUL characters); expected text'),
    ]);
  if (text.trim().length === 0)
    throw new ParseFailure([fileError(file, null, null, 'empty_file', 'the file holds no text')]);
  return { text, encoding };
}

/** Split into lines (LF, CRLF or CR), refusing any line longer than the cap. */
export function splitLines(file: string, text: string, maxLineLength = MAX_LINE_LENGTH): string[] {
  const lines = text.split(/\r\n|\n|\r/);
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  for (let i = 0; i < lines.length; i++) {
    if (lines[i].length > maxLineLength)
      throw new ParseFailure([
        fileError(
          file,
          i + 1,
          null,
          'line_too_long',
          `line ${i + 1} is ${lines[i].length} characters long (the limit is ${maxLineLength})`,
        ),
      ]);
  }
  return lines;
}

/** Fast numeric test of one field: a finite number, the fill value, empty, or bad text. */
export type NumKind = 'num' | 'empty' | 'nan' | 'inf' | 'text';
export function classifyNumber(s: string): { kind: NumKind; value: number } {
  if (s.length === 0) return { kind: 'empty', value: NaN };
  const v = Number(s);
  if (Number.isFinite(v)) {
    // Number() accepts hex, binary and octal literals, which are never data in a cast file.
    const c1 = s.charCodeAt(1) | 0x20;
    if (s.length > 1 && s.charCodeAt(0) === 48 && (c1 === 120 || c1 === 98 || c1 === 111))
      return { kind: 'text', value: NaN };
    return { kind: 'num', value: v };
  }
  const low = s.toLowerCase().replace(/^[+-]/, '');
  if (low === 'nan') return { kind: 'nan', value: NaN };
  if (low === 'inf' || low === 'infinity') return { kind: 'inf', value: NaN };
  return { kind: 'text', value: NaN };
}

/** True for the trade's fill values: -999 (however written: -999.0, -9.99E+02), -9.0E+02, -9999, -99999. */
export function isFill(v: number): boolean {
  return v === -999 || v === -900 || v === -9999 || v === -99999;
}
