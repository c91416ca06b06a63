// ECharts on the client only, with just the parts the report draws: lines and bars on a value/category
// grid, shaded spans (markArea), a legend, a tooltip and zoom. Charts are bound inside <ClientOnly>.
import { use } from 'echarts/core'
import { BarChart, LineChart } from 'echarts/charts'
import { DataZoomComponent, GridComponent, LegendComponent, MarkAreaComponent, TooltipComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'
import VChart from 'vue-echarts'

use([CanvasRenderer, LineChart, BarChart, GridComponent, TooltipComponent, LegendComponent, DataZoomComponent, MarkAreaComponent])

export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.vueApp.component('VChart', VChart)
})

declare module 'vue' {
  interface GlobalComponents {
    VChart: typeof VChart
  }
}
