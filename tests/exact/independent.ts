/**
 * Independent computations for the exact-reference tests, written here from the differential
 * equation and sharing no code with core/exact:
 * - `shootRk4`: the classical fourth-order Runge–Kutta method (E. Hairer, S. P. Nørsett &
 *   G. Wanner, Solving Ordinary Differential Equations I, §II.1, from memory) on
 *   y′ = F/S(x), F′ = −ω² I(x) y piece by piece, with the jump F⁺ = F⁻ + (k − ω² m) y at every
 *   station (the station's equation of motion −ω² m y = F⁺ − F⁻ − k y); its value is the end's
 *   boundary quantity. Frequencies from its sign changes, Richardson-extrapolated over two
 *   step sizes (error ∝ h⁴).
 * - `globalDeterminant`: the classical collocation of piecewise solutions — two constants per
 *   piece (cos, sin for a prismatic piece; cos kr / r, sin kr / r in the apex coordinate r of an
 *   axial cone, A ∝ r²), one equation per boundary and two per interior station — whose
 *   determinant vanishes at the natural frequencies.
 */

export interface TestPiece {
  readonly length: number
  /** Stiffness and inertia per length at the piece's start; both ∝ (1 + (ratio − 1) x/length)^power. */
  readonly stiffness: number
  readonly inertia: number
  readonly ratio: number
  readonly power: 2 | 4
}

export interface TestChain {
  readonly pieces: readonly TestPiece[]
  /** pieces.length + 1 stations: grounded stiffness and point inertia. */
  readonly springs: readonly number[]
  readonly masses: readonly number[]
  readonly fixedStart: boolean
  readonly fixedEnd: boolean
}

function profile(piece: TestPiece, x: number): number {
  return (1 + ((piece.ratio - 1) * x) / piece.length) ** piece.power
}

/** (y, F) at the end of a piece from (y, F) at its start, by RK4 with `steps` steps. */
export function integratePiece(piece: TestPiece, omega: number, y0: number, f0: number, steps: number): [number, number] {
  const w2 = omega * omega
  const h = piece.length / steps
  const dy = (x: number, fx: number) => fx / (piece.stiffness * profile(piece, x))
  const df = (x: number, yx: number) => -w2 * piece.inertia * profile(piece, x) * yx
  let y = y0
  let f = f0
  for (let j = 0; j < steps; j++) {
    const x = j * h
    const k1y = dy(x, f)
    const k1f = df(x, y)
    const k2y = dy(x + h / 2, f + (h / 2) * k1f)
    const k2f = df(x + h / 2, y + (h / 2) * k1y)
    const k3y = dy(x + h / 2, f + (h / 2) * k2f)
    const k3f = df(x + h / 2, y + (h / 2) * k2y)
    const k4y = dy(x + h, f + h * k3f)
    const k4f = df(x + h, y + h * k3y)
    y += (h / 6) * (k1y + 2 * k2y + 2 * k3y + k4y)
    f += (h / 6) * (k1f + 2 * k2f + 2 * k3f + k4f)
  }
  return [y, f]
}

/** End residual (F at a free end, y at a fixed one) by RK4 with `steps` steps per piece. */
export function shootRk4(chain: TestChain, omega: number, steps: number): number {
  const w2 = omega * omega
  let y = chain.fixedStart ? 0 : 1
  let f = chain.fixedStart ? 1 : (chain.springs[0] - w2 * chain.masses[0]) * y
  chain.pieces.forEach((piece, i) => {
    ;[y, f] = integratePiece(piece, omega, y, f, steps)
    f += (chain.springs[i + 1] - w2 * chain.masses[i + 1]) * y
    const scale = Math.abs(y) + Math.abs(f) / piece.stiffness
    y /= scale
    f /= scale
  })
  return chain.fixedEnd ? y : f
}

/** Roots of g in (0, omegaMax] by a uniform scan of `grid` cells and bisection to ~1e-15. */
export function scanRoots(g: (omega: number) => number, omegaMax: number, grid: number): [number, number][] {
  const brackets: [number, number][] = []
  let a = omegaMax / grid / 1000
  let ga = g(a)
  for (let i = 1; i <= grid; i++) {
    const b = (omegaMax * i) / grid
    const gb = g(b)
    if (ga * gb < 0) brackets.push([a, b])
    a = b
    ga = gb
  }
  return brackets
}

export function bisect(g: (omega: number) => number, lo: number, hi: number): number {
  let a = lo
  let b = hi
  let ga = g(a)
  for (let i = 0; i < 200 && b - a > 1e-15 * b; i++) {
    const m = 0.5 * (a + b)
    const gm = g(m)
    if (gm === 0) return m
    if (gm * ga < 0) b = m
    else {
      a = m
      ga = gm
    }
  }
  return 0.5 * (a + b)
}

/**
 * The lowest natural frequencies (rad/s, a rigid-body 0 not included) by RK4 shooting:
 * roots bracketed on a scan with `scanSteps` steps per piece, then each root found with
 * n and 2n steps and extrapolated, f ≈ f₂ₙ + (f₂ₙ − fₙ)/15.
 */
export function rk4Frequencies(chain: TestChain, omegaMax: number, options: { grid?: number; scanSteps?: number; steps?: number } = {}): number[] {
  const { grid = 400, scanSteps = 200, steps = 1000 } = options
  const brackets = scanRoots((w) => shootRk4(chain, w, scanSteps), omegaMax, grid)
  return brackets.map(([a, b]) => {
    // Widen the coarse bracket a little: the fine solutions' roots move by the coarse error.
    const lo = a * (1 - 1e-3)
    const hi = b * (1 + 1e-3)
    const coarse = bisect((w) => shootRk4(chain, w, steps), lo, hi)
    const fine = bisect((w) => shootRk4(chain, w, 2 * steps), lo, hi)
    return fine + (fine - coarse) / 15
  })
}

// ---------------------------------------------------------------- global determinant (axial)

export interface AxialPiece {
  readonly length: number
  readonly youngsModulus: number
  readonly density: number
  /** Area at the piece's start; a cone's diameter ratio end/start (1: prismatic). */
  readonly area: number
  readonly ratio: number
}

/** Sign-carrying determinant of the collocation matrix at ω (Gaussian elimination, partial pivoting). */
export function globalDeterminant(
  pieces: readonly AxialPiece[],
  springs: readonly number[],
  masses: readonly number[],
  fixedStart: boolean,
  fixedEnd: boolean,
  omega: number,
): number {
  const n = 2 * pieces.length
  const rows: number[][] = []
  const w2 = omega * omega
  // Basis values (u, N) of piece p at local ξ, for its two constants.
  const basis = (p: number, xi: number): [number, number, number, number] => {
    const piece = pieces[p]
    const k = omega * Math.sqrt(piece.density / piece.youngsModulus)
    const EA0 = piece.youngsModulus * piece.area
    if (piece.ratio === 1) {
      return [Math.cos(k * xi), Math.sin(k * xi), -EA0 * k * Math.sin(k * xi), EA0 * k * Math.cos(k * xi)]
    }
    // Apex coordinate: d ∝ r, r₀ = ℓ/(ratio − 1); u = cos(kr)/r, sin(kr)/r; A = A₀ (r/r₀)².
    const r0 = piece.length / (piece.ratio - 1)
    const r = r0 + xi
    const EA = EA0 * (r / r0) ** 2
    const c = Math.cos(k * r)
    const s = Math.sin(k * r)
    return [c / r, s / r, EA * ((-k * s) / r - c / (r * r)), EA * ((k * c) / r - s / (r * r))]
  }
  const row = () => new Array<number>(n).fill(0)
  // Start.
  {
    const [u1, u2, n1, n2] = basis(0, 0)
    const r = row()
    if (fixedStart) {
      r[0] = u1
      r[1] = u2
    } else {
      const z = springs[0] - w2 * masses[0]
      r[0] = n1 - z * u1
      r[1] = n2 - z * u2
    }
    rows.push(r)
  }
  for (let p = 1; p < pieces.length; p++) {
    const [a1, a2, an1, an2] = basis(p - 1, pieces[p - 1].length)
    const [b1, b2, bn1, bn2] = basis(p, 0)
    const z = springs[p] - w2 * masses[p]
    const continuity = row()
    continuity[2 * p - 2] = a1
    continuity[2 * p - 1] = a2
    continuity[2 * p] = -b1
    continuity[2 * p + 1] = -b2
    rows.push(continuity)
    // N⁺ − N⁻ − z u = 0.
    const balance = row()
    balance[2 * p - 2] = -an1
    balance[2 * p - 1] = -an2
    balance[2 * p] = bn1 - z * b1
    balance[2 * p + 1] = bn2 - z * b2
    rows.push(balance)
  }
  {
    const last = pieces.length - 1
    const [u1, u2, n1, n2] = basis(last, pieces[last].length)
    const r = row()
    if (fixedEnd) {
      r[n - 2] = u1
      r[n - 1] = u2
    } else {
      const z = springs[pieces.length] - w2 * masses[pieces.length]
      r[n - 2] = n1 + z * u1
      r[n - 1] = n2 + z * u2
    }
    rows.push(r)
  }
  // Equilibrate rows so that no row's scale dominates the pivoting.
  for (const r of rows) {
    const scale = Math.max(...r.map(Math.abs)) || 1
    for (let j = 0; j < n; j++) r[j] /= scale
  }
  let det = 1
  for (let col = 0; col < n; col++) {
    let best = col
    for (let i = col + 1; i < n; i++) if (Math.abs(rows[i][col]) > Math.abs(rows[best][col])) best = i
    if (rows[best][col] === 0) return 0
    if (best !== col) {
      ;[rows[best], rows[col]] = [rows[col], rows[best]]
      det = -det
    }
    det *= rows[col][col]
    for (let i = col + 1; i < n; i++) {
      const factor = rows[i][col] / rows[col][col]
      for (let j = col; j < n; j++) rows[i][j] -= factor * rows[col][j]
    }
  }
  return det
}
