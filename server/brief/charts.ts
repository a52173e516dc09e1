/**
 * ECharts options → SVG strings on the server (no DOM, no canvas): the same options the page
 * draws, for the PDF brief. `echarts.init(null, null, { renderer: 'svg', ssr: true })` lays the
 * chart out and `renderToSVGString()` returns it; the instance is disposed at once.
 */
import * as echarts from 'echarts'
import type { EChartsOption } from 'echarts'

/** Font family the SVG text asks for; pdfmake maps it to the registered Inter files. */
export const CHART_PDF_FONT = 'Inter'

/**
 * Screen pixels per PDF point used for layout. The options are written for the page, where a
 * chart is some 500 px wide; laying the chart out on a canvas 1.4 times the printed size and
 * letting the SVG's viewBox scale it down keeps the page's proportions between text and plot
 * (11 px axis labels print at about 8 pt).
 */
export const CHART_LAYOUT_SCALE = 1.4

/**
 * Renders one chart to an SVG string.
 *
 * @param option - an ECharts option (animation is switched off here whatever it says)
 * @param size - printed width and height in PDF points; the SVG is laid out at
 *   CHART_LAYOUT_SCALE times that and scales down through its viewBox when printed at `width`
 * @returns the SVG document
 */
export function renderChartSvg(option: EChartsOption, size: { width: number, height: number }): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width: Math.round(size.width * CHART_LAYOUT_SCALE), height: Math.round(size.height * CHART_LAYOUT_SCALE) })
  try {
    const textStyle = { ...(option.textStyle as Record<string, unknown> | undefined), fontFamily: CHART_PDF_FONT }
    chart.setOption({ ...option, animation: false, textStyle, tooltip: undefined })
    return chart.renderToSVGString()
  } finally {
    chart.dispose()
  }
}
