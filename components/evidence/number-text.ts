/**
 * A number typed into a form: blank means "not given"; a comma is read as a decimal point
 * (many lab keyboards and locales type one). Anything else unreadable becomes NaN, which the
 * zod schemas refuse with the field's own message.
 */
export function numberFromText(text: string): number | undefined {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return undefined;
  return /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/** Significant figures without trailing noise: 0.0650 µm/px, 1.23e-4 stays readable. */
export function formatNumber(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return '–';
  if (value !== 0 && Math.abs(value) < 1e-3) return value.toExponential(digits - 1);
  return Number(value.toPrecision(digits)).toString();
}
