// @vitest-environment happy-dom
/**
 * Components where it matters: the modes table (digits, units, rigid-body modes), the
 * resonance table (the closest pair marked), and the whole window on the demo: solved at
 * start, warnings reachable, edits re-solved, undo from the keyboard. Expected numbers
 * come from core; the demo is a fixture. (Charts are checked in the browser tests.)
 */
import { afterEach, describe, expect, it } from 'vitest'
import { mount, type VueWrapper } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { readProjectDocument, readProjectText } from '../../core/model/project-schema'
import { formatFigure } from '../../core/report/number-format'
import { useFileStore } from '../../renderer/stores/file-store'
import ModesTable from '../../renderer/components/ModesTable.vue'
import ResonanceTable from '../../renderer/components/ResonanceTable.vue'
import App from '../../renderer/App.vue'
import { setBridge } from '../../renderer/bridge/bridge'
import { createInlineSolverClient, setSolver } from '../../renderer/solver/solver-client'
import { SOLVE_DEBOUNCE_MS } from '../../renderer/stores/results-store'
import { DEMO_TEXT, freshApp, MemoryBridge, settle } from './renderer-helpers'
import { chainFrequencies, chainFromDocument } from '../chain-reference'

function demo() {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('fixture')
  return read.project
}

describe('modes table', () => {
  it('shows Hz and rpm (1 rpm = 1/60 Hz), the exact value and the effective mass in the chosen units', () => {
    freshApp()
    const analysis = analyseProject(demo())
    const wrapper = mount(ModesTable, { props: { modes: analysis.modes, units: 'US', shownModes: [0], closest: new Map() } })
    const first = wrapper.get('[data-testid="mode-row-1"]').findAll('td').map((td) => td.text())
    expect(first[2]).toBe('axial')
    expect(first[3]).toBe(formatFigure(analysis.modes[0].frequencyHz, 5))
    expect(first[4]).toBe(formatFigure(analysis.modes[0].frequencyHz * 60, 5))
    // Effective mass in lbm: kg / 0.45359237 (NIST SP 811).
    expect(first[7]).toBe(formatFigure(analysis.modes[0].effectiveMass! / 0.45359237, 4))
    expect(wrapper.text()).toContain('Effective mass (lbm)')
  })

  it('marks rigid-body modes of an unsupported bar', () => {
    const read = readProjectDocument({
      format: 'rodwave',
      version: 1,
      materials: [{ id: 's', youngsModulus: 200e9, density: 7850 }],
      segments: [{ length: 1, material: 's', section: { shape: 'solid', diameter: 0.02 } }],
      ends: { start: 'free', end: 'free' },
      analysis: { modes: 3 },
    })
    if (!read.ok) throw new Error('fixture')
    const analysis = analyseProject(read.project)
    const wrapper = mount(ModesTable, { props: { modes: analysis.modes, units: 'SI', shownModes: [], closest: new Map() } })
    expect(wrapper.get('[data-testid="mode-row-1"]').text()).toContain('rigid body')
    expect(wrapper.get('[data-testid="mode-row-2"]').text()).not.toContain('rigid body')
  })
})

describe('resonance table', () => {
  it('marks the closest pair and can show conflicts only', async () => {
    const analysis = analyseProject(demo())
    const closest = [...analysis.resonance].sort((a, b) => Math.abs(a.separation) - Math.abs(b.separation))[0]
    const basis = new Map(analysis.modes.filter((m) => m.referenceHz !== null).map((m) => [`${m.family} ${m.mode}`, 'exact' as const]))
    const wrapper = mount(ResonanceTable, { props: { pairs: analysis.resonance, closest, conflictsOnly: false, basis } })
    expect(wrapper.findAll('tbody tr')).toHaveLength(analysis.resonance.length)
    const row = wrapper.get('[data-testid="closest-pair"]')
    expect(row.classes()).toContain('closest')
    expect(row.text()).toContain(closest.band.label)
    await wrapper.setProps({ conflictsOnly: true })
    expect(wrapper.findAll('tbody tr')).toHaveLength(analysis.resonance.filter((p) => p.status === 'conflict').length)
  })
})

describe('the window', () => {
  let wrapper: VueWrapper | null = null
  afterEach(() => {
    wrapper?.unmount()
    wrapper = null
  })

  async function mountApp(): Promise<VueWrapper> {
    setBridge(new MemoryBridge())
    setSolver(createInlineSolverClient())
    const app = mount(App, { global: { plugins: [createPinia()] }, attachTo: document.body })
    for (let i = 0; i < 20 && !app.find('[data-testid="first-frequency"]').exists(); i++) await settle()
    return app
  }

  it('opens on the demo solved, its first frequency as the engine computes it', async () => {
    wrapper = await mountApp()
    const expected = analyseProject(demo()).modes[0].frequencyHz
    expect(wrapper.get('[data-testid="first-frequency"]').text()).toBe(formatFigure(expected, 5))
    // The banner's figures against the demo's first frequency computed independently (tests/chain-reference.ts).
    const f1 = chainFrequencies(chainFromDocument(JSON.parse(DEMO_TEXT)), 200, 0.5)[0]
    // The family in conflict is named first.
    const banner = /Axial mode 1 at (\S+) Hz is (\S+) % above Motor twice line frequency \(100 Hz\)/.exec(wrapper.get('[data-testid="conflict-banner"]').text())
    expect(banner, 'banner sentence').not.toBeNull()
    expect(banner![1]).toBe(f1.toPrecision(3))
    expect(banner![2]).toBe(((100 * (f1 - 100)) / 100).toPrecision(2))
  })

  it('keeps the warnings and the cautions one click away', async () => {
    wrapper = await mountApp()
    await wrapper.get('[data-testid="warnings-button"]').trigger('click')
    expect(wrapper.get('[data-testid="warnings-list"]').text()).toContain('Motor twice line frequency')
    await wrapper.get('[data-testid="cautions-button"]').trigger('click')
    const cautions = wrapper.get('[data-testid="cautions-dialog"]').text()
    for (const words of [
      'Linear elastic',
      'Small displacements',
      'No damping',
      'impact test',
      'local codes and licensed engineering practice',
      // What the three families still leave out.
      'gyroscopic effects',
      'rotor-dynamics analysis',
      'Coupled bending and torsion',
      'Initial curvature',
    ]) {
      expect(cautions).toContain(words)
    }
  })

  it('closes the warnings panel with Escape and when another view is chosen', async () => {
    wrapper = await mountApp()
    await wrapper.get('[data-testid="warnings-button"]').trigger('click')
    expect(wrapper.find('[data-testid="warnings-panel"]').exists()).toBe(true)
    document.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape', bubbles: true }))
    await settle(1)
    expect(wrapper.find('[data-testid="warnings-panel"]').exists()).toBe(false)
    await wrapper.get('[data-testid="warnings-button"]').trigger('click')
    await wrapper.get('[data-testid="view-resonance"]').trigger('click')
    await settle(1)
    expect(wrapper.find('[data-testid="warnings-panel"]').exists()).toBe(false)
  })

  it('re-solves an edited length and undoes it with Ctrl+Z', async () => {
    wrapper = await mountApp()
    await wrapper.get('[data-testid="view-part"]').trigger('click')
    const input = wrapper.get('[data-testid="segment-2-length"]')
    await input.trigger('focus')
    await input.setValue('0.7')
    await new Promise((resolve) => setTimeout(resolve, SOLVE_DEBOUNCE_MS + 20))
    await settle()
    const changed = demo()
    changed.segments[2].length = 0.7
    // The pipe clamp sat at the bar's end (2.91 m): it moves with the end to 2.76 m.
    changed.masses[1].at = 2.76
    const expected = analyseProject(changed).modes[0].frequencyHz
    expect(Number(wrapper.get('[data-testid="first-frequency"]').text())).toBeCloseTo(Number(formatFigure(expected, 5)), 10)
    window.dispatchEvent(new KeyboardEvent('keydown', { key: 'z', ctrlKey: true }))
    await new Promise((resolve) => setTimeout(resolve, SOLVE_DEBOUNCE_MS + 20))
    await settle()
    expect(wrapper.get('[data-testid="first-frequency"]').text()).toBe(formatFigure(analyseProject(demo()).modes[0].frequencyHz, 5))
    expect(useFileStore().ready).toBe(true)
  })
})
