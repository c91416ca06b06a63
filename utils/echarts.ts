// ECharts with just the parts the report draws: lines and bars on a value/category grid, shaded
// spans (markArea), a legend, a tooltip and zoom. Imported by the chart components only, so the
// charting code loads with the report pages, not with every page of the app.
import { use } from 'echarts/core'
import { BarChart, LineChart } from 'echarts/charts'
import { DataZoomComponent, GridComponent, LegendComponent, MarkAreaComponent, TooltipComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'
import VChart from 'vue-echarts'

use([CanvasRenderer, LineChart, BarChart, GridComponent, TooltipComponent, LegendComponent, DataZoomComponent, MarkAreaComponent])

export { VChart }
