/**
 * Charts for the report without a browser: ECharts' server-side rendering to an SVG string
 * (init with ssr: true and the SVG renderer, no DOM), the chart always disposed afterwards.
 */
import { init, use, type EChartsCoreOption } from 'echarts/core'
import { LineChart, ScatterChart, CustomChart } from 'echarts/charts'
import { GraphicComponent, GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, MarkPointComponent, TitleComponent } from 'echarts/components'
import { SVGRenderer } from 'echarts/renderers'

// Everything the shared builders in core/charts use, and nothing for interaction (tooltips, zoom).
use([SVGRenderer, LineChart, ScatterChart, CustomChart, GraphicComponent, GridComponent, LegendComponent, TitleComponent, MarkAreaComponent, MarkLineComponent, MarkPointComponent])

export interface ChartSize {
  readonly width: number
  readonly height: number
}

/** One chart as a standalone <svg> element, drawn at `size` px (the report scales it to the page). */
export function renderChartSvg(option: EChartsCoreOption, size: ChartSize): string {
  const chart = init(null, null, { renderer: 'svg', ssr: true, width: size.width, height: size.height })
  try {
    chart.setOption({ ...option, animation: false })
    return withoutHoverStyles(chart.renderToSVGString())
  } finally {
    chart.dispose()
  }
}

/** A <style> block of the SVG whose every rule is a :hover rule. */
const STYLE_BLOCK = /<style\b[^>]*>([\s\S]*?)<\/style>/g

function onlyHoverRules(css: string): boolean {
  const rules = css
    .replace(/<!\[CDATA\[|\]\]>/g, '')
    .split('}')
    .map((rule) => rule.trim())
    .filter((rule) => rule.length > 0)
  return rules.every((rule) => /:hover\s*\{/.test(rule) && !rule.slice(0, rule.indexOf('{')).includes(','))
}

/**
 * ECharts writes hover effects (pointer cursor, lighter fill) as a stylesheet inside the SVG.
 * A printed or filed report has nothing to hover, so those sheets are dropped; any other
 * style is kept.
 */
export function withoutHoverStyles(svg: string): string {
  return svg.replace(STYLE_BLOCK, (block: string, css: string) => (onlyHoverRules(css) ? '' : block))
}
