// Is this file UTF-8 text? Checks for the start of a file (byte-order marks, spreadsheet
// workbooks, UTF-16 without a mark) and a streaming check for the rest, so a bad byte anywhere
// in a large file is found without holding the file in memory.
import { isUtf8 } from "node:buffer";

export const SAVE_AS_UTF8_ADVICE =
  "Open it in your spreadsheet program, save it as “CSV UTF-8 (comma delimited)” or another CSV with UTF-8 encoding, and upload it again.";

export type HeadCheck = { ok: true; bomLength: number } | { ok: false; message: string };

/** Index of the first byte that breaks UTF-8, or -1. A sequence cut off by the end of `buf` is fine when `partialEndOk`. */
export function firstInvalidUtf8(buf: Uint8Array, partialEndOk = false): number {
  const n = buf.length;
  let i = 0;
  while (i < n) {
    const b = buf[i];
    if (b < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let lo = 0x80;
    let hi = 0xbf;
    if (b >= 0xc2 && b <= 0xdf) need = 1;
    else if (b >= 0xe0 && b <= 0xef) {
      need = 2;
      if (b === 0xe0) lo = 0xa0;
      else if (b === 0xed) hi = 0x9f; // UTF-16 surrogates are not UTF-8
    } else if (b >= 0xf0 && b <= 0xf4) {
      need = 3;
      if (b === 0xf0) lo = 0x90;
      else if (b === 0xf4) hi = 0x8f;
    } else return i;
    for (let k = 1; k <= need; k++) {
      if (i + k >= n) return partialEndOk ? -1 : i;
      const c = buf[i + k];
      if (k === 1 ? c < lo || c > hi : c < 0x80 || c > 0xbf) return i;
    }
    i += need + 1;
  }
  return -1;
}

function lineAt(buf: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset; i++) if (buf[i] === 0x0a) line++;
  return line;
}

export function notUtf8Message(line: number): string {
  return `The file is not UTF-8 text: line ${line} has characters we can't read. ${SAVE_AS_UTF8_ADVICE}`;
}

/**
 * Checks the first bytes of a file. `wholeFile` says `head` is all of it (so a sequence cut off
 * at the end is an error rather than the edge of the sample).
 */
export function checkHead(head: Uint8Array, wholeFile: boolean): HeadCheck {
  if (head.length >= 2 && ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff))) {
    return { ok: false, message: `The file is saved as UTF-16 text, which we can't read. ${SAVE_AS_UTF8_ADVICE}` };
  }
  if (head.length >= 4 && head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04) {
    return {
      ok: false,
      message: `This looks like a spreadsheet workbook (.xlsx) or a zip file, not CSV text. ${SAVE_AS_UTF8_ADVICE}`,
    };
  }
  if (head.length >= 4 && head[0] === 0xd0 && head[1] === 0xcf && head[2] === 0x11 && head[3] === 0xe0) {
    return { ok: false, message: `This looks like an older spreadsheet workbook (.xls), not CSV text. ${SAVE_AS_UTF8_ADVICE}` };
  }
  const probe = head.subarray(0, Math.min(head.length, 4096));
  if (probe.includes(0)) {
    // UTF-16 without a byte-order mark has a zero byte beside every ASCII character.
    return {
      ok: false,
      message: `The file contains zero bytes: it may be UTF-16 text or not text at all. ${SAVE_AS_UTF8_ADVICE}`,
    };
  }
  const bomLength = head.length >= 3 && head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf ? 3 : 0;
  const bad = firstInvalidUtf8(head, !wholeFile);
  if (bad !== -1) return { ok: false, message: notUtf8Message(lineAt(head, bad)) };
  return { ok: true, bomLength };
}

/** Length of an unfinished UTF-8 sequence at the end of buf (0–3 bytes). */
function unfinishedTail(buf: Uint8Array): number {
  const n = buf.length;
  for (let back = 1; back <= Math.min(3, n); back++) {
    const b = buf[n - back];
    if ((b & 0xc0) === 0x80) continue; // continuation byte: keep looking for the lead
    const length = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
    return length > back ? back : 0;
  }
  return 0;
}

/** Feeds chunks of a file in order; says where the first non-UTF-8 byte is, by line. */
export class Utf8StreamCheck {
  private carry: Buffer = Buffer.alloc(0);
  private lines = 1;

  /** The line number of a bad byte in this chunk, or 0 when the chunk is fine so far. */
  push(chunk: Buffer): number {
    const data = this.carry.length > 0 ? Buffer.concat([this.carry, chunk]) : chunk;
    const tail = unfinishedTail(data);
    const body = data.subarray(0, data.length - tail);
    if (!isUtf8(body)) {
      const bad = firstInvalidUtf8(body);
      return this.lines + lineAt(body, bad === -1 ? body.length : bad) - 1;
    }
    for (let i = body.indexOf(0x0a); i !== -1; i = body.indexOf(0x0a, i + 1)) this.lines++;
    this.carry = Buffer.from(data.subarray(data.length - tail));
    return 0;
  }

  /** At the end of the file: the line of an unfinished character, or 0. */
  end(): number {
    return this.carry.length > 0 ? this.lines : 0;
  }
}
