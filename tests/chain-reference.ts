/**
 * Natural frequencies of a bar of uniform segments with point masses, computed for the tests
 * without core/: the project file's JSON read here, and a shooting method on the state
 * (u, N = EA u′). Over a uniform piece of length ℓ, with k = ω√(ρ/E),
 *   u(ℓ) = u cos kℓ + N sin kℓ/(EAk),   N(ℓ) = −EAk u sin kℓ + N cos kℓ
 * (the exact solution of EA u″ + ρAω² u = 0; S. S. Rao, Mechanical Vibrations, longitudinal
 * vibration of bars, from memory); a point mass M makes N jump by −ω²M u. From the start
 * condition (fixed: u = 0, N = 1; free: u = 1, N = 0) the end condition (fixed: u = 0; free:
 * N = 0) is a continuous function of ω whose sign changes, found on a fine scan and refined by
 * bisection, are the natural frequencies (a double root without sign change would be missed: the
 * callers check the count). Checked against closed forms in tests/exact/chain-reference.test.ts.
 */

interface ChainPiece {
  readonly length: number
  readonly stiffness: number // EA, N
  readonly waveSpeed: number // √(E/ρ), m/s
}

export interface Chain {
  readonly start: 'fixed' | 'free'
  readonly end: 'fixed' | 'free'
  /** Pieces from the start, each followed by the point mass at its end (kg, 0 for none). */
  readonly pieces: readonly (ChainPiece & { readonly massAtEnd: number })[]
  /** A point mass at x = 0. */
  readonly massAtStart: number
}

interface DocumentSection {
  shape: string
  diameter?: number
  outerDiameter?: number
  innerDiameter?: number
  area?: number
  width?: number
  height?: number
}

interface ChainDocument {
  materials?: { id: string; youngsModulus: number; density: number }[]
  segments: { length: number; material: string; section: DocumentSection }[]
  ends: { start: 'fixed' | 'free'; end: 'fixed' | 'free' }
  masses?: { at: number; mass: number }[]
  springs?: unknown[]
}

/** Section area by the elementary formulas (πd²/4, π(D² − d²)/4, w·h, or as given). */
function sectionArea(s: DocumentSection): number {
  if (s.shape === 'solid') return (Math.PI / 4) * s.diameter! ** 2
  if (s.shape === 'tube') return (Math.PI / 4) * (s.outerDiameter! ** 2 - s.innerDiameter! ** 2)
  if (s.shape === 'rectangle') return s.width! * s.height!
  if (s.shape === 'area') return s.area!
  throw new Error(`chain reference: section shape "${s.shape}" is not supported`)
}

/** The chain of a project document (SI; materials defined in the file; no springs, no cones). */
export function chainFromDocument(doc: ChainDocument): Chain {
  if (doc.springs && doc.springs.length > 0) throw new Error('chain reference: springs are not supported')
  const breaks: { at: number; stiffness: number; waveSpeed: number }[] = []
  let x = 0
  for (const segment of doc.segments) {
    const material = doc.materials?.find((m) => m.id === segment.material)
    if (!material) throw new Error(`chain reference: material "${segment.material}" must be defined in the file`)
    x += segment.length
    breaks.push({ at: x, stiffness: material.youngsModulus * sectionArea(segment.section), waveSpeed: Math.sqrt(material.youngsModulus / material.density) })
  }
  const masses = doc.masses ?? []
  const cuts = [...new Set([...breaks.map((b) => b.at), ...masses.map((m) => m.at)])].filter((at) => at > 0).sort((a, b) => a - b)
  const pieces: (ChainPiece & { massAtEnd: number })[] = []
  let from = 0
  for (const to of cuts) {
    const segment = breaks.find((b) => b.at >= to - 1e-12)!
    const massAtEnd = masses.filter((m) => Math.abs(m.at - to) <= 1e-12).reduce((s, m) => s + m.mass, 0)
    pieces.push({ length: to - from, stiffness: segment.stiffness, waveSpeed: segment.waveSpeed, massAtEnd })
    from = to
  }
  const massAtStart = masses.filter((m) => m.at <= 1e-12).reduce((s, m) => s + m.mass, 0)
  return { start: doc.ends.start, end: doc.ends.end, pieces, massAtStart }
}

/** The end condition (u or N at the end) for angular frequency ω. */
export function endCondition(chain: Chain, omega: number): number {
  let u = chain.start === 'fixed' ? 0 : 1
  let n = chain.start === 'fixed' ? 1 : 0
  n -= omega * omega * chain.massAtStart * u
  for (const piece of chain.pieces) {
    const k = omega / piece.waveSpeed
    const s = Math.sin(k * piece.length)
    const c = Math.cos(k * piece.length)
    const eak = piece.stiffness * k
    const nextU = u * c + (n * s) / eak
    const nextN = -eak * u * s + n * c
    u = nextU
    n = nextN - omega * omega * piece.massAtEnd * u
  }
  return chain.end === 'fixed' ? u : n
}

/** Natural frequencies (Hz) in (0, maxHz], by a scan in steps of stepHz and bisection to the last bit. */
export function chainFrequencies(chain: Chain, maxHz: number, stepHz: number): number[] {
  const value = (hz: number) => endCondition(chain, 2 * Math.PI * hz)
  const found: number[] = []
  let lo = stepHz * 1e-3
  let fLo = value(lo)
  for (let hi = stepHz; hi <= maxHz; hi += stepHz) {
    const fHi = value(hi)
    if (Math.sign(fHi) !== Math.sign(fLo)) {
      let a = lo
      let b = hi
      const signA = Math.sign(fLo)
      for (let i = 0; i < 200 && b - a > 4e-16 * b; i++) {
        const mid = 0.5 * (a + b)
        if (Math.sign(value(mid)) === signA) a = mid
        else b = mid
      }
      found.push(0.5 * (a + b))
    }
    lo = hi
    fLo = fHi
  }
  return found
}
