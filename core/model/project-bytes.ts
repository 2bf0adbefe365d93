/**
 * The one rule for the bytes of a project file, shared by the command line, the desktop app
 * and the browser: UTF-8, with an optional byte-order mark (dropped), and nothing else.
 * Invalid UTF-8 is refused with its position instead of being read with replacement
 * characters, so a file is either read exactly or not at all.
 *
 * Well-formedness follows the Unicode Standard, chapter 3, Table 3-7 "Well-Formed UTF-8
 * Byte Sequences" (no overlong forms, no surrogates, nothing above U+10FFFF). Checked by
 * hand because core/ has neither the DOM's nor Node's TextDecoder.
 */

/** Largest project file any front end reads: 20 MiB, so whatever the app saves it can open again. */
export const MAX_PROJECT_BYTES = 20 * 1024 * 1024

export type ProjectBytesResult = { readonly ok: true; readonly text: string } | { readonly ok: false; readonly message: string }

const CHUNK_UNITS = 8192

/** Where a byte offset lies, in the words a text editor uses. */
function position(bytes: Uint8Array, offset: number): string {
  let line = 1
  for (let i = 0; i < offset; i++) if (bytes[i] === 0x0a) line++
  return `byte ${(offset + 1).toLocaleString('en-US')}, line ${line.toLocaleString('en-US')}`
}

function invalid(bytes: Uint8Array, offset: number): ProjectBytesResult {
  return {
    ok: false,
    message: `is not UTF-8 text (${position(bytes, offset)} does not start a valid UTF-8 character); save it as UTF-8 and open it again`,
  }
}

/**
 * The second byte's range for each lead byte (Table 3-7); every later byte is 80..BF.
 * Returns the sequence length, or 0 when `lead` cannot start a sequence.
 */
function sequenceLength(lead: number): number {
  if (lead < 0x80) return 1
  if (lead < 0xc2) return 0
  if (lead < 0xe0) return 2
  if (lead < 0xf0) return 3
  if (lead < 0xf5) return 4
  return 0
}

function secondByteRange(lead: number): [number, number] {
  if (lead === 0xe0) return [0xa0, 0xbf]
  if (lead === 0xed) return [0x80, 0x9f]
  if (lead === 0xf0) return [0x90, 0xbf]
  if (lead === 0xf4) return [0x80, 0x8f]
  return [0x80, 0xbf]
}

/** Decoded UTF-16 code units → text, in slices small enough for one call. */
function unitsToText(units: Uint16Array, from: number, to: number, parts: string[]): void {
  for (let at = from; at < to; at += CHUNK_UNITS) {
    parts.push(String.fromCharCode.apply(null, units.subarray(at, Math.min(at + CHUNK_UNITS, to)) as unknown as number[]))
  }
}

/** Decodes a project file's bytes: the text, or why the bytes are not a UTF-8 text file. */
export function decodeProjectBytes(bytes: Uint8Array): ProjectBytesResult {
  if ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff)) {
    return { ok: false, message: 'is UTF-16 text; Rodwave reads project files in UTF-8: save it as UTF-8 and open it again' }
  }
  const start = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0
  const end = bytes.length
  const parts: string[] = []
  /** Decoded UTF-16 code units not yet turned into text. */
  const units = new Uint16Array(CHUNK_UNITS + 1)
  let count = 0
  let i = start
  while (i < end) {
    const lead = bytes[i]
    if (lead < 0x80) {
      units[count++] = lead
      i += 1
      if (count >= CHUNK_UNITS) {
        unitsToText(units, 0, count, parts)
        count = 0
      }
      continue
    }
    const length = sequenceLength(lead)
    if (length === 0 || i + length > end) return invalid(bytes, i)
    const [low, high] = secondByteRange(lead)
    const second = bytes[i + 1]
    if (second < low || second > high) return invalid(bytes, i)
    for (let k = 2; k < length; k++) {
      const next = bytes[i + k]
      if (next < 0x80 || next > 0xbf) return invalid(bytes, i)
    }
    let codePoint: number
    if (length === 2) codePoint = ((lead & 0x1f) << 6) | (second & 0x3f)
    else if (length === 3) codePoint = ((lead & 0x0f) << 12) | ((second & 0x3f) << 6) | (bytes[i + 2] & 0x3f)
    else codePoint = ((lead & 0x07) << 18) | ((second & 0x3f) << 12) | ((bytes[i + 2] & 0x3f) << 6) | (bytes[i + 3] & 0x3f)
    if (codePoint >= 0x10000) {
      // Above the Basic Multilingual Plane: a UTF-16 surrogate pair.
      const offset = codePoint - 0x10000
      units[count++] = 0xd800 | (offset >> 10)
      units[count++] = 0xdc00 | (offset & 0x3ff)
    } else {
      units[count++] = codePoint
    }
    i += length
    if (count >= CHUNK_UNITS) {
      unitsToText(units, 0, count, parts)
      count = 0
    }
  }
  if (count > 0) unitsToText(units, 0, count, parts)
  return { ok: true, text: parts.join('') }
}
