/** README's licence table matches the packages actually installed (name, version, licence). */
import { describe, expect, test } from 'vitest'
import { readFileSync } from 'node:fs'

const readme = readFileSync('README.md', 'utf8')
const section = readme.slice(readme.indexOf('## Licences'))
const rows = [...section.matchAll(/^\| ([^|]+?) \| ([\d.]+) \| ([^|]+?) \|$/gm)].map((m) => ({ name: m[1].split(' (')[0].trim(), version: m[2], licence: m[3].trim() }))

describe('README licence table', () => {
  test('lists the shipped runtime packages', () => {
    expect(rows.map((r) => r.name)).toEqual(expect.arrayContaining(['vue', 'pinia', 'echarts', 'zrender', 'vue-echarts', 'zod', 'electron']))
  })
  test.each(rows)('$name', ({ name, version, licence }) => {
    const pkg = JSON.parse(readFileSync(`node_modules/${name}/package.json`, 'utf8'))
    expect(pkg.version).toBe(version)
    expect(pkg.license).toBe(licence)
  })
})
