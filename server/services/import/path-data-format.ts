/**
 * Absolute path commands → SVG path data text, shared by the SVG and font imports.
 * Commands are written one after another with single spaces ("M10 -20 L30 40 Z"), arc
 * flags as 0/1, and −0 as 0.
 */

/** One absolute command: its letter and its numbers (arc flags as 0 or 1). */
export type PathCommand = readonly [string, ...number[]]

/**
 * Significant digits kept for imported SVG coordinates. Source files carry about 3–8 digits
 * (common practice for drawing programs) and composing transforms adds relative noise of a few
 * 2^-52; 12 digits keep 4 or more guard digits over the source and drop that noise
 * (3 × 0.1 is written 0.3, not 0.30000000000000004).
 */
export const SIGNIFICANT_DIGITS = 12

/** Decimal places for arc rotation angles in degrees (|angle| < 1000: 12 significant digits, less 3). */
export const ANGLE_DECIMALS = SIGNIFICANT_DIGITS - 3

/**
 * Decimal places that keep SIGNIFICANT_DIGITS digits for numbers up to `largest` in
 * magnitude; 0 when `largest` is 0 or not finite. Smaller numbers keep the same absolute
 * precision, so noise such as 6e-17 next to coordinates near 100 is written 0.
 */
export function chooseDecimals(largest: number): number {
  if (!(largest > 0) || !Number.isFinite(largest)) return 0
  return Math.min(100, Math.max(0, SIGNIFICANT_DIGITS - Math.ceil(Math.log10(largest))))
}

/** A number as path data: shortest round-trip text, or rounded to `decimals` places; −0 → "0". */
export function formatNumber(value: number, decimals?: number): string {
  const rounded = decimals === undefined || Math.abs(value) >= 1e21 ? value : Number(value.toFixed(decimals))
  return rounded === 0 ? '0' : String(rounded)
}

/**
 * Path commands as text. `decimals` rounds coordinates and radii; arc rotation angles use
 * ANGLE_DECIMALS and arc flags are written 0/1. Without `decimals` every number is written
 * exactly (shortest round-trip form).
 */
export function formatPathCommands(commands: readonly PathCommand[], decimals?: number): string {
  const parts: string[] = []
  for (const [letter, ...values] of commands) {
    const upper = letter.toUpperCase()
    const text = values.map((value, i) => {
      if (upper === 'A' && (i === 3 || i === 4)) return value ? '1' : '0'
      if (upper === 'A' && i === 2) return formatNumber(value, decimals === undefined ? undefined : ANGLE_DECIMALS)
      return formatNumber(value, decimals)
    })
    parts.push(text.length === 0 ? letter : `${letter}${text.join(' ')}`)
  }
  return parts.join(' ')
}
