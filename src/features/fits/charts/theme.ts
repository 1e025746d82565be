import { buildChartTheme } from '@visx/xychart';

/**
 * Lariat's chart look: the teal of the app first, then colours far enough apart to tell a dozen
 * coefficient paths apart (checked by eye on white and on slate-900).
 */
export const SERIES_COLORS = ['#1a6d67', '#e09b14', '#3b6fb6', '#c2416b', '#5b8c2a', '#8a55b5', '#d0612b', '#2a9bb0', '#7a6a3a', '#b23a3a', '#4a7a6a', '#a0528c'];

export const MARK_COLORS = { chosen: '#c2416b', minimum: '#3b6fb6', oneSe: '#b9770d', reference: '#94a3b8' } as const;

export const chartTheme = buildChartTheme({
  backgroundColor: 'transparent',
  colors: SERIES_COLORS,
  tickLength: 4,
  gridColor: '#cbd5e1',
  gridColorDark: '#64748b',
  svgLabelSmall: { fill: '#64748b', fontSize: 11, fontFamily: 'Lato, system-ui, sans-serif' },
  svgLabelBig: { fill: '#64748b', fontSize: 12, fontFamily: 'Lato, system-ui, sans-serif', fontWeight: 700 },
  xAxisLineStyles: { stroke: '#94a3b8' },
  yAxisLineStyles: { stroke: '#94a3b8' },
  xTickLineStyles: { stroke: '#94a3b8' },
  yTickLineStyles: { stroke: '#94a3b8' },
  htmlLabel: { fontFamily: 'Lato, system-ui, sans-serif', fontSize: 12 },
});

export const MARGIN = { top: 16, right: 16, bottom: 44, left: 60 };
