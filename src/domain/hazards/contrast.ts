/**
 * WCAG 2.x relative luminance and contrast ratio, so the matrix colours can be
 * checked against the day and night surfaces instead of judged by eye.
 */

const HEX = /^#[0-9a-fA-F]{6}$/;

export function isHexColour(value: unknown): value is string {
  return typeof value === 'string' && HEX.test(value);
}

function channel(c8: number): number {
  const c = c8 / 255;
  return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** Relative luminance of a #rrggbb colour, 0 (black) .. 1 (white). */
export function relativeLuminance(hex: string): number {
  if (!isHexColour(hex)) throw new Error(`Not a #rrggbb colour: ${hex}`);
  const n = parseInt(hex.slice(1), 16);
  return 0.2126 * channel(n >> 16) + 0.7152 * channel((n >> 8) & 0xff) + 0.0722 * channel(n & 0xff);
}

/** (L1 + 0.05) / (L2 + 0.05), lighter over darker: 1 .. 21. */
export function contrastRatio(a: string, b: string): number {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}
