/**
 * Colours and type of every chart, from the design tokens in tailwind.config.ts (river = primary,
 * ochre = accent, slate = neutrals). Pure data, so the page (vue-echarts) and the server (ECharts
 * SVG rendering for the PDF brief) draw the same chart from the same option.
 *
 * Read by shared/charts/census-chart.ts and shared/charts/projection-chart.ts. Changing a colour
 * here changes it in the page and in briefs alike.
 */
export const CHART_COLOURS = {
  /** river-800: the main series (isolated / adults). */
  primary: '#194c4e',
  /** river-500: a second series of the same family (males). */
  primarySoft: '#2a9291',
  /** ochre-500: the contrasting series (with gene flow / females). */
  accent: '#d38c20',
  /** slate-300: a quiet remainder (adults not sexed). */
  quiet: '#cbd5e1',
  /** slate-600 / slate-500 / slate-200: text, axis labels, grid lines. */
  text: '#475569',
  axis: '#64748b',
  grid: '#e2e8f0',
} as const

/** The UI font first, then fallbacks that exist on servers without it. */
export const CHART_FONT_FAMILY = '"Inter Variable", Inter, ui-sans-serif, system-ui, sans-serif'

/** Common top-level settings: font, no background, animation only where asked for. */
export function chartBase(animation: boolean) {
  return {
    animation,
    backgroundColor: 'transparent',
    textStyle: { fontFamily: CHART_FONT_FAMILY, color: CHART_COLOURS.text },
  }
}

/** An axis in our style (labels in slate, light dashed split lines). */
export function axisStyle() {
  return {
    axisLine: { lineStyle: { color: CHART_COLOURS.grid } },
    axisTick: { show: false },
    axisLabel: { color: CHART_COLOURS.axis, fontSize: 11 },
    splitLine: { lineStyle: { color: CHART_COLOURS.grid, type: 'dashed' as const } },
    nameTextStyle: { color: CHART_COLOURS.axis, fontSize: 11 },
  }
}
