/** Significant digits shown by default; 17 always identify a double exactly (IEEE-754 round trip). */
export const SHORT_DIGITS = 6
export const FULL_DIGITS = 17

/**
 * A number for people: 6 significant digits, or 17 "on demand" (enough to read back the
 * exact double). −0 shows as 0; integers of up to 17 digits are shown whole.
 */
export function formatNumber(value: number, full: boolean): string {
  if (!Number.isFinite(value)) return String(value)
  if (value === 0) return '0'
  if (full) return value.toPrecision(FULL_DIGITS)
  if (Number.isInteger(value) && Math.abs(value) < 1e15) return String(value)
  return String(Number(value.toPrecision(SHORT_DIGITS)))
}
