import { BarElement, CategoryScale, Chart, Legend, LinearScale, LogarithmicScale, PointElement, Tooltip } from 'chart.js'

// Only the pieces the Suites and Audits screens draw (bar and scatter charts), registered once.
Chart.register(BarElement, CategoryScale, LinearScale, LogarithmicScale, PointElement, Tooltip, Legend)

/** Chart colours that follow the theme; series also differ by pattern or label, never by colour alone. */
export function chartColours(dark: boolean) {
  return {
    text: dark ? '#CBD5E1' : '#334155',
    grid: dark ? 'rgba(203, 213, 225, 0.12)' : 'rgba(51, 65, 85, 0.12)',
    passed: dark ? '#4ADE80' : '#15803D',
    failed: dark ? '#F87171' : '#B91C1C',
    accent: dark ? '#2DD4BF' : '#0F766E',
    probe: dark ? '#FB8A6E' : '#E0603F',
    series: dark ? ['#2DD4BF', '#FB8A6E', '#FBBF24', '#A5B4FC'] : ['#0F766E', '#E0603F', '#B45309', '#4338CA'],
  }
}
