/**
 * The bytes of a project file: UTF-8 with or without a byte-order mark is read exactly;
 * anything else is refused with its position. Checked against two sources outside the
 * project: the Unicode Standard's table of well-formed UTF-8 (chapter 3, Table 3-7) and
 * an independent decoder, the WHATWG Encoding Standard's UTF-8 decoder as Node ships it
 * (TextDecoder with fatal: true), on random byte strings (fast-check, fixed seed).
 */
import { describe, expect } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import { decodeProjectBytes, MAX_PROJECT_BYTES } from '../../core/model/project-bytes'

const bytes = (...values: number[]) => Uint8Array.from(values)
const reference = new TextDecoder('utf-8', { fatal: true })

/** The WHATWG decoder's verdict; it drops one leading byte-order mark, as the rule does. */
function referenceDecode(input: Uint8Array): { ok: true; text: string } | { ok: false } {
  try {
    return { ok: true, text: reference.decode(input) }
  } catch {
    return { ok: false }
  }
}

describe('well-formed UTF-8 is read exactly', () => {
  test('ASCII, two-, three- and four-byte characters', () => {
    const text = '{"title":"Zugstange Ø 24 mm — Pumpe ✓ 𝜔₁"}'
    const result = decodeProjectBytes(new TextEncoder().encode(text))
    expect(result).toEqual({ ok: true, text })
  })

  test('a leading byte-order mark (EF BB BF) is dropped, and only one', () => {
    expect(decodeProjectBytes(bytes(0xef, 0xbb, 0xbf, 0x7b, 0x7d))).toEqual({ ok: true, text: '{}' })
    expect(decodeProjectBytes(bytes(0xef, 0xbb, 0xbf, 0xef, 0xbb, 0xbf, 0x7b))).toEqual({ ok: true, text: '\uFEFF{' })
  })

  test('an empty file decodes to empty text (the reader then says it is empty)', () => {
    expect(decodeProjectBytes(bytes())).toEqual({ ok: true, text: '' })
  })

  // The Unicode Standard, chapter 3, Table 3-7: the first and last sequence of every row.
  test.each([
    ['U+0000', [0x00], '\u0000'],
    ['U+007F', [0x7f], '\u007f'],
    ['U+0080', [0xc2, 0x80], '\u0080'],
    ['U+07FF', [0xdf, 0xbf], '\u07ff'],
    ['U+0800', [0xe0, 0xa0, 0x80], '\u0800'],
    ['U+0FFF', [0xe0, 0xbf, 0xbf], '\u0fff'],
    ['U+1000', [0xe1, 0x80, 0x80], '\u1000'],
    ['U+CFFF', [0xec, 0xbf, 0xbf], '\ucfff'],
    ['U+D000', [0xed, 0x80, 0x80], '\ud000'],
    ['U+D7FF', [0xed, 0x9f, 0xbf], '\ud7ff'],
    ['U+E000', [0xee, 0x80, 0x80], '\ue000'],
    ['U+FFFF', [0xef, 0xbf, 0xbf], '\uffff'],
    ['U+10000', [0xf0, 0x90, 0x80, 0x80], '\u{10000}'],
    ['U+3FFFF', [0xf0, 0xbf, 0xbf, 0xbf], '\u{3ffff}'],
    ['U+40000', [0xf1, 0x80, 0x80, 0x80], '\u{40000}'],
    ['U+FFFFF', [0xf3, 0xbf, 0xbf, 0xbf], '\u{fffff}'],
    ['U+100000', [0xf4, 0x80, 0x80, 0x80], '\u{100000}'],
    ['U+10FFFF', [0xf4, 0x8f, 0xbf, 0xbf], '\u{10ffff}'],
  ])('%s (Table 3-7)', (_name, sequence, expected) => {
    expect(decodeProjectBytes(bytes(...sequence))).toEqual({ ok: true, text: expected })
  })

  test('long text across the decoder’s internal chunks, with four-byte characters on every boundary', () => {
    // 3 ASCII + 1 four-byte character = 5 UTF-16 units per group: groups straddle every chunk edge.
    const text = 'abc𝜔'.repeat(20_000)
    expect(decodeProjectBytes(new TextEncoder().encode(text))).toEqual({ ok: true, text })
  })
})

describe('anything else is refused with its position', () => {
  // Ill-formed sequences: outside Table 3-7's ranges (overlong forms, surrogates, beyond
  // U+10FFFF, bytes that never occur, lone or missing continuation bytes).
  test.each([
    ['a lone continuation byte', [0x41, 0x80]],
    ['C0 (only overlong forms)', [0xc0, 0xaf]],
    ['C1 (only overlong forms)', [0xc1, 0xbf]],
    ['an overlong three-byte form E0 80..9F', [0xe0, 0x80, 0xaf]],
    ['an overlong four-byte form F0 80..8F', [0xf0, 0x80, 0x80, 0xaf]],
    ['a UTF-16 surrogate encoded as UTF-8 (ED A0..BF)', [0xed, 0xa0, 0x80]],
    ['beyond U+10FFFF (F4 90..)', [0xf4, 0x90, 0x80, 0x80]],
    ['F5 (never occurs)', [0xf5, 0x80, 0x80, 0x80]],
    ['FF (never occurs)', [0x41, 0xff]],
    ['a sequence cut short by the end of the file', [0x41, 0xe2, 0x82]],
    ['a sequence cut short by an ASCII byte', [0xe2, 0x41, 0x82]],
    ['Latin-1 text (é as the single byte E9)', [0x63, 0x61, 0x66, 0xe9, 0x22]],
  ])('%s', (_what, sequence) => {
    const result = decodeProjectBytes(bytes(...sequence))
    expect(result.ok).toBe(false)
    expect(referenceDecode(bytes(...sequence)).ok).toBe(false)
  })

  test('the message says what is wrong and where (byte and line, counted from 1)', () => {
    const input = new TextEncoder().encode('{\n  "title": "caf?"\n}')
    const at = input.indexOf(0x3f)
    input[at] = 0xe9
    const result = decodeProjectBytes(input)
    expect(result).toEqual({
      ok: false,
      message: `is not UTF-8 text (byte ${at + 1}, line 2 does not start a valid UTF-8 character); save it as UTF-8 and open it again`,
    })
  })

  test('UTF-16 (either byte order) is named as such', () => {
    for (const mark of [
      [0xff, 0xfe],
      [0xfe, 0xff],
    ]) {
      const result = decodeProjectBytes(bytes(...mark, 0x7b, 0x00))
      expect(result.ok).toBe(false)
      expect(!result.ok && result.message).toMatch(/^is UTF-16 text; Rodwave reads project files in UTF-8/)
    }
  })

  test('the size limit is 20 MiB', () => {
    expect(MAX_PROJECT_BYTES).toBe(20 * 1024 * 1024)
  })
})

describe('agrees with an independent decoder (WHATWG UTF-8, fatal) on random bytes', () => {
  // Bytes drawn so that well-formed and ill-formed sequences both occur often: lead bytes of
  // every length, continuation bytes, ASCII, and the byte-order mark at the start.
  const interesting = fc.oneof(
    fc.integer({ min: 0x00, max: 0x7f }),
    fc.integer({ min: 0x80, max: 0xbf }),
    fc.integer({ min: 0xc0, max: 0xff }),
    fc.constantFrom(0xe0, 0xed, 0xf0, 0xf4, 0xef, 0xbb, 0xbf),
  )
  const encoded = fc.string({ unit: 'binary', maxLength: 40 }).map((s) => Array.from(new TextEncoder().encode(s)))
  const input = fc
    .tuple(fc.boolean(), fc.array(fc.oneof(encoded, fc.array(interesting, { maxLength: 6 })), { maxLength: 8 }))
    .map(([withMark, pieces]) => Uint8Array.from([...(withMark ? [0xef, 0xbb, 0xbf] : []), ...pieces.flat()]))

  test.prop([input], { numRuns: 3000, seed: 11 })('same verdict and same text', (data) => {
    // A UTF-16 mark is Rodwave's own refusal; the WHATWG decoder would read FF FE as two bad bytes anyway.
    const ours = decodeProjectBytes(data)
    const theirs = referenceDecode(data)
    expect(ours.ok).toBe(theirs.ok)
    if (ours.ok && theirs.ok) expect(ours.text).toBe(theirs.text)
  })
})
