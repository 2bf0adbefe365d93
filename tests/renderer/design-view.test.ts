// @vitest-environment happy-dom
/**
 * The design view in the whole window on the demo (a fixture): reachable like the other views,
 * its sensitivity table ranked as the engine ranks them and worded per row, the basis of each
 * panel stated, the cautions one click away, a row's Tune button choosing that parameter, and
 * the tolerances edited as fractions with undo. (Charts are checked in the browser tests.)
 */
import { afterEach, describe, expect, it } from 'vitest'
import { mount, type VueWrapper } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { readProjectText } from '../../core/model/project-schema'
import { designParameters } from '../../core/analysis/design-parameters'
import { frequencySensitivities } from '../../core/analysis/sensitivity'
import App from '../../renderer/App.vue'
import { setBridge } from '../../renderer/bridge/bridge'
import { createInlineSolverClient, setSolver } from '../../renderer/solver/solver-client'
import { useProjectStore } from '../../renderer/stores/project-store'
import { useTunerStore } from '../../renderer/stores/tuner-store'
import { rankedSensitivities, sensitivitySentence } from '../../renderer/format/design-text'
import { DEMO_TEXT, MemoryBridge, settle } from './renderer-helpers'

function demo() {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('fixture')
  return read.project
}

describe('design view', () => {
  let wrapper: VueWrapper | null = null
  afterEach(() => {
    wrapper?.unmount()
    wrapper = null
  })

  async function openDesign(): Promise<VueWrapper> {
    setBridge(new MemoryBridge())
    setSolver(createInlineSolverClient())
    const app = mount(App, { global: { plugins: [createPinia()] }, attachTo: document.body })
    for (let i = 0; i < 20 && !app.find('[data-testid="first-frequency"]').exists(); i++) await settle()
    await app.get('[data-testid="view-design"]').trigger('click')
    for (let i = 0; i < 20 && !app.find('[data-testid="sensitivity-row-1"]').exists(); i++) await settle()
    return app
  }

  it('lists mode 1’s sensitivities in the engine’s order, each in words', async () => {
    wrapper = await openDesign()
    const project = demo()
    const expected = rankedSensitivities(frequencySensitivities(project, project.analysis.modes), 1)
    const parameters = designParameters(project)
    const rows = wrapper.findAll('[data-testid^="sensitivity-row-"]')
    expect(rows.map((r) => r.attributes('data-parameter'))).toEqual(expected.map((s) => s.parameter))
    // The view's sensitivities carry their family: the sentence names it ("raises axial mode 1").
    expect(rows[0].text()).toContain(sensitivitySentence({ ...expected[0], motion: 'axial' } as typeof expected[0], parameters.find((p) => p.path === expected[0].parameter)!, 'SI'))
    expect(rows[0].text()).toContain('raises axial mode 1')
    expect(wrapper.get('[data-testid="design-basis"]').text()).toContain('exact frequencies')
  })

  it('states each panel’s basis and keeps the cautions one click away', async () => {
    wrapper = await openDesign()
    await wrapper.get('[data-testid="design-panel-scatter"]').trigger('click')
    expect(wrapper.get('[data-testid="design-basis"]').text()).toContain('finite-element model on the current mesh')
    await wrapper.get('[data-testid="design-cautions"]').trigger('click')
    expect(wrapper.get('[data-testid="cautions-dialog"]').text()).toContain('Design guidance')
  })

  it('chooses a row’s parameter for the tuner', async () => {
    wrapper = await openDesign()
    const row = wrapper.get('[data-testid="sensitivity-row-2"]')
    await wrapper.get('[data-testid="tune-from-2"]').trigger('click')
    expect(useTunerStore().parameter?.path).toBe(row.attributes('data-parameter'))
    expect((wrapper.get('[data-testid="tune-parameter"]').element as HTMLSelectElement).value).toBe(row.attributes('data-parameter'))
  })

  it('edits a tolerance in % and stores the fraction, undoably', async () => {
    wrapper = await openDesign()
    await wrapper.get('[data-testid="design-panel-scatter"]').trigger('click')
    const input = wrapper.get('[data-testid="tolerance-youngsModulus"]')
    await input.trigger('focus')
    await input.setValue('4')
    const project = useProjectStore()
    expect(project.draft.tolerances?.youngsModulus).toBeCloseTo(0.04, 15)
    project.undo()
    expect(project.draft.tolerances?.youngsModulus).toBe(demo().tolerances!.youngsModulus)
  })
})
