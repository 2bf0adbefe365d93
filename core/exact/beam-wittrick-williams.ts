/**
 * The Wittrick–Williams count for a beam chain: the number of natural frequencies below ω is
 *   J(ω) = Σ J₀(member pieces) + s{K(ω)},
 * J₀ the clamped–clamped frequencies of each piece below ω and s{K} the negative eigenvalues of
 * the assembled dynamic stiffness on the stations' unknowns (w, θ) (W. H. Wittrick &
 * F. W. Williams, Q. J. Mech. Appl. Math. 24 (1971) 263–284, from memory). Members are cut into
 * pieces whose J₀ is 0 by a rigorous bound (beam-transfer-matrix.ts), so only s{K} is counted.
 *
 * s{K} is the number of negative eigenvalues of the 2×2 pivot blocks of a block LDLᵀ taken
 * station by station from the start (Sylvester's law of inertia with the Haynsworth inertia
 * additivity, from memory), computed here in transfer-matrix form rather than from assembled
 * stiffness numbers. Everything to the left of a station is carried as the set of its admissible
 * states, two columns Y = [D; F] of the state (w, θ, f_w, f_θ); then
 *   the pivot block of station i is congruent to  Dᵢᵀ · T₁₂⁻¹ · Dᵢ₊₁,
 * with T the transfer matrix of the piece to its right and Dᵢ₊₁ the displacement rows of T·Y
 * (it is Dᵢᵀ(Z + K₁₁)Dᵢ, with the condensed stiffness Z = F D⁻¹ and K₁₁ = T₁₂⁻¹T₁₁), and the last
 * station's block is Z itself (congruent to Dᵀ F at a free end). Carrying Y instead of Z keeps the
 * small forces of a nearly rigid motion to full relative precision (a stiffness-form elimination
 * would lose them to cancellation against the members' large stiffness numbers); Y is
 * re-orthonormalised after each piece by Gram–Schmidt with a positive diagonal, which changes
 * neither the subspace, nor the inertia of the blocks, nor the sign of any 2×2 determinant of Y.
 *
 * The same sweep gives the shooting residual: the determinant of the end's boundary rows of Y
 * (f at a free end, d at a clamped one, (w, f_θ) pinned, (θ, f_w) guided). It is a multiple, by a
 * positive factor, of an entire function of ω whose zeros are exactly the natural frequencies,
 * so it changes sign through each simple one and refines the roots to full precision.
 *
 * Round-off: the count is exact except within a few ulps of a natural frequency, where the
 * pivots' signs are decided by round-off (measured: at most one ulp off, where a root coincides
 * with one of the structure clamped at its end, as for uniform guided–free); callers never
 * evaluate it at a root.
 */
import { checkBeamChain, type BeamChain } from './beam-chain'
import { beamPieceTransfer, piecesPerMember } from './beam-transfer-matrix'

export interface BeamSweep {
  /** s{K}: with pieces from beamPieces at this ω, the number of natural frequencies below ω. */
  readonly count: number
  /** The end's boundary determinant (sign matters; zero at each natural frequency). */
  readonly residual: number
}

const MAX_PIECES = 1_000_000

/** Pieces per member for which J₀ = 0 at ω (and at every lower ω). */
export function beamPieces(chain: BeamChain, omega: number): number[] {
  const pieces = chain.members.map((member) => piecesPerMember(member, chain.axialForce, omega))
  const total = pieces.reduce((a, b) => a + b, 0)
  if (total > MAX_PIECES) {
    const worst = pieces.indexOf(Math.max(...pieces))
    throw new RangeError(
      `members[${worst}]: the exact beam reference would cut the part into ${total} pieces at ω = ${omega} rad/s (limit ${MAX_PIECES}); ` +
        'the member is too slender for its axial force or the frequency is too high',
    )
  }
  return pieces
}

/** One sweep from the start to the end at ω with the given pieces per member (J₀ = 0 each). */
export function beamSweep(chain: BeamChain, omega: number, pieces: readonly number[]): BeamSweep {
  const w2 = omega * omega
  let totalLength = 0
  let eiRef = 0
  for (const member of chain.members) {
    totalLength += member.length
    eiRef = Math.max(eiRef, member.bendingStiffness)
  }
  // Dimensionless state (w/L, θ, f_w L²/EI, f_θ L/EI) with reference length and stiffness.
  const lr = totalLength / chain.members.length
  const unit = [1 / lr, 1, (lr * lr) / eiRef, lr / eiRef]
  // y[2·row + column]; rows w, θ, f_w, f_θ. Station columns come first so that Gram–Schmidt
  // never mixes a reaction column into a (possibly nearly rigid) motion column.
  const y = new Float64Array(8)
  let stationColumns: number
  switch (chain.start) {
    case 'free':
      y[0] = 1
      y[3] = 1
      stationColumns = 2
      break
    case 'pinned': // column 0: the rotation; column 1: the reaction force
      y[2] = 1
      y[5] = 1
      stationColumns = 1
      break
    case 'guided': // column 0: the translation; column 1: the reaction moment
      y[0] = 1
      y[7] = 1
      stationColumns = 1
      break
    case 'clamped':
      y[4] = 1
      y[7] = 1
      stationColumns = 0
      break
  }
  const addStation = (s: number) => {
    const sw = ((chain.stationSideStiffness[s] - w2 * chain.stationMass[s]) * lr ** 3) / eiRef
    const st = ((chain.stationRotationalStiffness[s] - w2 * chain.stationRotaryInertia[s]) * lr) / eiRef
    for (let c = 0; c < 2; c++) {
      y[4 + c] += sw * y[c]
      y[6 + c] += st * y[2 + c]
    }
  }
  addStation(0)

  let count = 0
  let firstPiece = true
  const next = new Float64Array(8)
  chain.members.forEach((member, i) => {
    const n = pieces[i]
    const phys = beamPieceTransfer(member.length / n, member.bendingStiffness, member.massPerLength, chain.axialForce, omega)
    const t = new Float64Array(16)
    for (let r = 0; r < 4; r++) for (let c = 0; c < 4; c++) t[r * 4 + c] = (phys[r * 4 + c] * unit[r]) / unit[c]
    // T₁₂⁻¹ (non-singular: the piece has no clamped–clamped frequency at or below ω).
    const det12 = t[2] * t[7] - t[3] * t[6]
    const i00 = t[7] / det12
    const i01 = -t[3] / det12
    const i10 = -t[6] / det12
    const i11 = t[2] / det12
    for (let k = 0; k < n; k++) {
      for (let r = 0; r < 4; r++) {
        const a = t[r * 4]
        const b = t[r * 4 + 1]
        const c = t[r * 4 + 2]
        const d = t[r * 4 + 3]
        next[2 * r] = a * y[0] + b * y[2] + c * y[4] + d * y[6]
        next[2 * r + 1] = a * y[1] + b * y[3] + c * y[5] + d * y[7]
      }
      // X = T₁₂⁻¹ D_next, then the pivot block Dᵀ X.
      const x00 = i00 * next[0] + i01 * next[2]
      const x01 = i00 * next[1] + i01 * next[3]
      const x10 = i10 * next[0] + i11 * next[2]
      const x11 = i10 * next[1] + i11 * next[3]
      const m00 = y[0] * x00 + y[2] * x10
      const m01 = y[0] * x01 + y[2] * x11
      const m10 = y[1] * x00 + y[3] * x10
      const m11 = y[1] * x01 + y[3] * x11
      if (firstPiece) {
        // Only the start's free unknowns belong to K (reaction columns carry no unknown).
        if (stationColumns === 2) count += negativeEigenvalues(m00, 0.5 * (m01 + m10), m11)
        else if (stationColumns === 1) count += m00 <= 0 ? 1 : 0
        firstPiece = false
      } else count += negativeEigenvalues(m00, 0.5 * (m01 + m10), m11)
      y.set(next)
      if (k === n - 1) addStation(i + 1)
      orthonormalise(y)
    }
  })

  const d00 = y[0]
  const d01 = y[1]
  const d10 = y[2]
  const d11 = y[3]
  const f00 = y[4]
  const f01 = y[5]
  const f10 = y[6]
  const f11 = y[7]
  const detD = d00 * d11 - d01 * d10
  switch (chain.end) {
    case 'free': {
      // Last block Z = F D⁻¹, congruent to Dᵀ F.
      const a = d00 * f00 + d10 * f10
      const b = 0.5 * (d00 * f01 + d10 * f11 + d01 * f00 + d11 * f10)
      const c = d01 * f01 + d11 * f11
      count += negativeEigenvalues(a, b, c)
      return { count, residual: f00 * f11 - f01 * f10 }
    }
    case 'clamped':
      return { count, residual: detD }
    case 'pinned': {
      // w = 0 and f_θ = 0; the last block is Z_θθ = (F D⁻¹)_θθ.
      const residual = d00 * f11 - d01 * f10
      count += residual / detD <= 0 ? 1 : 0
      return { count, residual }
    }
    case 'guided': {
      // θ = 0 and f_w = 0; the last block is Z_ww = (F D⁻¹)_ww.
      const residual = d11 * f00 - d10 * f01
      count += residual / detD <= 0 ? 1 : 0
      return { count, residual }
    }
  }
}

/** J(ω): number of natural frequencies strictly below ω > 0 (rad/s), by the Wittrick–Williams algorithm. */
export function beamModesBelow(chain: BeamChain, omega: number): number {
  checkBeamChain(chain)
  if (!(Number.isFinite(omega) && omega > 0)) throw new RangeError(`omega must be a positive finite angular frequency (rad/s); got ${omega}`)
  return beamSweep(chain, omega, beamPieces(chain, omega)).count
}

/**
 * Negative eigenvalues of [[a, b], [b, c]]: one when the determinant is negative, else both or
 * none by the sign of the trace (never of a alone: with one eigenvalue near zero the computed
 * determinant may come out slightly positive while a and c differ in sign). An exactly zero
 * eigenvalue counts as negative (a zero pivot taken as −0).
 */
function negativeEigenvalues(a: number, b: number, c: number): number {
  const det = a * c - b * b
  if (det > 0) return a + c < 0 ? 2 : 0
  if (det < 0) return 1
  return a + c < 0 ? 2 : 1
}

/** Gram–Schmidt on the two columns (twice, for orthogonality to round-off), positive diagonal. */
function orthonormalise(y: Float64Array): void {
  let n0 = 0
  for (let r = 0; r < 4; r++) n0 += y[2 * r] * y[2 * r]
  n0 = Math.sqrt(n0)
  for (let r = 0; r < 4; r++) y[2 * r] /= n0
  for (let pass = 0; pass < 2; pass++) {
    let dot = 0
    for (let r = 0; r < 4; r++) dot += y[2 * r] * y[2 * r + 1]
    for (let r = 0; r < 4; r++) y[2 * r + 1] -= dot * y[2 * r]
  }
  let n1 = 0
  for (let r = 0; r < 4; r++) n1 += y[2 * r + 1] * y[2 * r + 1]
  n1 = Math.sqrt(n1)
  for (let r = 0; r < 4; r++) y[2 * r + 1] /= n1
}
