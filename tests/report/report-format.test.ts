/**
 * The report's number formatting (significant figures, powers of ten, true minus signs)
 * and the clean-up of ECharts' SVG for a static document.
 */
import { describe, expect, test } from 'vitest'
import { formatFigure, formatScientific, formatSignedPercent, formatDateTime, formatRange, formatFrequency } from '../../core/report/number-format'
import { renderChartSvg, withoutHoverStyles } from '../../core/report/chart-svg'
import { escapeHtml } from '../../core/report/html'

describe('numbers', () => {
  test.each([
    [1234.5678, 4, '1235'],
    [0.16, 4, '0.1600'],
    [9.99996, 4, '10.00'],
    [-2.5, 3, '\u22122.50'],
    [123456.7, 4, '123\u2009500'],
    [2.05e11, 3, '2.05 × 10¹¹'],
    [0.000123, 3, '1.23 × 10⁻⁴'],
    [0, 4, '0'],
    [Number.NaN, 4, '—'],
  ])('formatFigure(%d, %d) = %s', (value, digits, text) => {
    expect(formatFigure(value, digits)).toBe(text)
  })

  test('scientific notation reads back to the value within its figures', () => {
    for (const v of [3.14159e-9, -6.02e23, 1e-300, 7.7e7]) {
      const text = formatScientific(v, 3)
      const match = /^(\u2212?)(\d\.\d\d) × 10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+)$/.exec(text)
      expect(match, text).not.toBeNull()
      const digits = '⁰¹²³⁴⁵⁶⁷⁸⁹'
      const exponent = Number([...match![3]].map((c) => (c === '⁻' ? '-' : String(digits.indexOf(c)))).join(''))
      const back = (match![1] ? -1 : 1) * Number(match![2]) * 10 ** exponent
      expect(Math.abs(back - v) / Math.abs(v)).toBeLessThanOrEqual(0.005)
    }
  })

  test('signed percentages, ranges, frequencies', () => {
    expect(formatSignedPercent(0.0642)).toBe('+6.4')
    expect(formatSignedPercent(-0.692)).toBe('\u221269.2')
    expect(formatSignedPercent(0.00001)).toBe('0.0')
    expect(formatRange([49.333, 49.833], (v) => v.toFixed(2))).toBe('49.33 – 49.83')
    expect(formatRange([100, 100], (v) => v.toFixed(1))).toBe('100.0')
    expect(formatFrequency(106.3612)).toBe('106.36')
  })

  test('date and time with the offset from UTC', () => {
    const date = new Date(2026, 0, 2, 3, 4)
    expect(formatDateTime(date)).toMatch(/^2026-01-02 03:04 \(UTC[+\u2212]\d\d:\d\d\)$/)
  })

  test('HTML escaping of every special character', () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;')
  })
})

describe('chart SVG for a static document', () => {
  test('hover-only style sheets are dropped, any other style kept', () => {
    const hover = '<svg><style ><![CDATA[\n.zr0-cls-0:hover {\ncursor:pointer;\n}\n.zr0-cls-1:hover {\npointer-events:none;\n}\n]]></style><path class="zr0-cls-0"/></svg>'
    expect(withoutHoverStyles(hover)).toBe('<svg><path class="zr0-cls-0"/></svg>')
    const other = '<svg><style>.a:hover{fill:red}\n.b{fill:blue}</style></svg>'
    expect(withoutHoverStyles(other)).toBe(other)
  })

  test('a chart renders without a DOM to one SVG element with its text escaped', () => {
    const svg = renderChartSvg(
      {
        xAxis: { type: 'value' },
        yAxis: { type: 'value' },
        legend: {},
        series: [{ type: 'line', name: 'a < b & "c"', data: [[0, 1], [1, 2]] }],
      },
      { width: 320, height: 200 },
    )
    expect(svg.startsWith('<svg')).toBe(true)
    expect(svg.trimEnd().endsWith('</svg>')).toBe(true)
    expect(svg.match(/<svg/g)?.length).toBe(1)
    expect(svg).toContain('width="320"')
    expect(svg).not.toContain('<style')
    expect(svg).toContain('a &lt; b &amp; &quot;c&quot;')
  })
})
