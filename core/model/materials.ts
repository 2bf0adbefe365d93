/**
 * Built-in materials: typical room-temperature handbook values. Real lots vary
 * (E ±3–5 % is common); a project can always define its own material instead.
 */
export interface LibraryMaterial {
  readonly id: string
  readonly name: string
  /** Pa */
  readonly youngsModulus: number
  /** kg/m³ */
  readonly density: number
  /** ν, for the shear modulus G = E / (2(1 + ν)) of torsion and shear deformation. */
  readonly poissonRatio: number
  readonly source: string
}

const ASM = 'ASM Handbook vol. 1 & 2, typical room-temperature value (from memory)'

export const MATERIAL_LIBRARY: readonly LibraryMaterial[] = [
  { id: 'carbon-steel', name: 'Carbon steel (AISI 1020/1045)', youngsModulus: 200e9, density: 7850, poissonRatio: 0.29, source: ASM },
  { id: 'stainless-304', name: 'Stainless steel 304', youngsModulus: 193e9, density: 8000, poissonRatio: 0.29, source: ASM },
  { id: 'aluminium-6061-t6', name: 'Aluminium 6061-T6', youngsModulus: 68.9e9, density: 2700, poissonRatio: 0.33, source: ASM },
  { id: 'titanium-6al-4v', name: 'Titanium Ti-6Al-4V', youngsModulus: 113.8e9, density: 4430, poissonRatio: 0.342, source: ASM },
  { id: 'copper-c11000', name: 'Copper C11000', youngsModulus: 115e9, density: 8890, poissonRatio: 0.34, source: ASM },
  { id: 'brass-c36000', name: 'Free-cutting brass C36000', youngsModulus: 97e9, density: 8500, poissonRatio: 0.31, source: ASM },
  { id: 'grey-iron-class-30', name: 'Grey cast iron, class 30', youngsModulus: 100e9, density: 7200, poissonRatio: 0.26, source: `${ASM}; E varies 90–113 GPa` },
]

export function libraryMaterial(id: string): LibraryMaterial | undefined {
  return MATERIAL_LIBRARY.find((m) => m.id === id)
}
