/**
 * Random mutations of a valid project file (fast-check, fixed seed): the reader either
 * refuses the file with every problem named by a JSON path, or returns a valid model that
 * the solver handles. It never throws and never reports a problem without a path.
 */
import { describe, expect } from 'vitest'
import { readFileSync } from 'node:fs'
import { fc, test } from '@fast-check/vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { readProjectText } from '../../core/model/project-schema'

const BASE = JSON.parse(readFileSync('examples/condensate-pump-hanger.rodwave.json', 'utf8'))

/** Every path to a value in a JSON document. */
function paths(value: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  const out: (string | number)[][] = [prefix]
  if (Array.isArray(value)) value.forEach((v, i) => out.push(...paths(v, [...prefix, i])))
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) out.push(...paths(v, [...prefix, k]))
  return out
}

const ALL_PATHS = paths(BASE).filter((p) => p.length > 0)

const junk = fc.oneof(
  fc.constant(null),
  fc.constant(-1),
  fc.constant(0),
  fc.constant(1e308),
  fc.constant('1e999'),
  fc.constant(''),
  fc.constant([]),
  fc.constant({}),
  fc.constant({ __proto__: { polluted: true } }),
  fc.string({ maxLength: 8 }),
  fc.double({ noNaN: false }),
  fc.integer(),
  fc.boolean(),
  fc.array(fc.double(), { maxLength: 3 }),
)

type Mutation = { kind: 'set'; path: (string | number)[]; value: unknown } | { kind: 'delete'; path: (string | number)[] } | { kind: 'add'; path: (string | number)[]; key: string; value: unknown }

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('set' as const), path: fc.constantFrom(...ALL_PATHS), value: junk }),
  fc.record({ kind: fc.constant('delete' as const), path: fc.constantFrom(...ALL_PATHS) }),
  fc.record({ kind: fc.constant('add' as const), path: fc.constantFrom([] as (string | number)[], ['segments', 0], ['analysis']), key: fc.constantFrom('constructor', '__proto__', 'prototype', 'extra', 'length'), value: junk }),
)

function apply(doc: unknown, m: Mutation): unknown {
  const copy = JSON.parse(JSON.stringify(doc))
  let parent: Record<string | number, unknown> = copy
  const path = m.path
  for (let i = 0; i < path.length - (m.kind === 'add' ? 0 : 1); i++) {
    parent = parent[path[i]] as Record<string | number, unknown>
    // An earlier mutation removed or replaced this branch: nothing left to mutate.
    if (parent === null || typeof parent !== 'object') return copy
  }
  if (m.kind === 'add') Object.defineProperty(parent, m.key, { value: m.value, enumerable: true, configurable: true, writable: true })
  else if (m.kind === 'delete') {
    const last = path[path.length - 1]
    if (Array.isArray(parent)) parent.splice(last as number, 1)
    else delete parent[last]
  } else parent[path[path.length - 1]] = m.value
  return copy
}

describe('mutated project files', () => {
  test.prop([fc.array(mutation, { minLength: 1, maxLength: 3 })], { numRuns: 400, seed: 5 })('are refused cleanly or solved', (mutations) => {
    let doc: unknown = BASE
    for (const m of mutations) doc = apply(doc, m)
    const text = JSON.stringify(doc)
    const result = readProjectText(text)
    if (!result.ok) {
      expect(result.issues.length).toBeGreaterThan(0)
      for (const issue of result.issues) {
        expect(issue.path, JSON.stringify(issue)).toMatch(/^(\(file\)|[A-Za-z_$][\w$]*(\[\d+\]|\.[A-Za-z_$][\w$]*|\["[^"]*"\])*)$/)
        expect(issue.message.length).toBeGreaterThan(3)
        expect(issue.message).not.toMatch(/\n\s+at /)
      }
      return
    }
    const analysis = analyseProject(result.project, { elementsPerSegment: 8, modes: 4 })
    expect(analysis.modes.length).toBeGreaterThan(0)
    for (const m of analysis.modes) expect(Number.isFinite(m.frequencyHz)).toBe(true)
    expect(({} as Record<string, unknown>).polluted).toBeUndefined()
  })
})
