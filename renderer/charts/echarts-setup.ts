/** The parts of ECharts the window uses, registered once (tree-shaken build, no eval under the CSP). */
import { use } from 'echarts/core'
import { LineChart, ScatterChart } from 'echarts/charts'
import {
  DataZoomComponent,
  GraphicComponent,
  GridComponent,
  LegendComponent,
  MarkAreaComponent,
  MarkLineComponent,
  TitleComponent,
  TooltipComponent,
} from 'echarts/components'
import { LabelLayout } from 'echarts/features'
import { SVGRenderer } from 'echarts/renderers'

// SVG keeps text crisp at any zoom and leaves the charts inspectable in the page.
use([
  SVGRenderer,
  LineChart,
  ScatterChart,
  GridComponent,
  LegendComponent,
  TooltipComponent,
  DataZoomComponent,
  MarkAreaComponent,
  MarkLineComponent,
  GraphicComponent,
  TitleComponent,
  // labelLayout { hideOverlap }: the charts' last guard against labels printed over each other.
  LabelLayout,
])
