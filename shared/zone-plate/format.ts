/**
 * Numbers in messages people read: four significant figures, no exponent, whole numbers from
 * 10 000 up. Four figures separate "needs 500.9 µm" from a 500 µm aperture.
 */
export function formatNumber(value: number): string {
  if (Math.abs(value) >= 10_000) return Math.round(value).toString();
  return Number(value.toPrecision(4)).toString();
}

/** A length given in µm, shown in mm from 1 mm up so that large apertures read naturally. */
export function formatLengthUm(valueUm: number): string {
  return Math.abs(valueUm) >= 1000 ? `${formatNumber(valueUm / 1000)} mm` : `${formatNumber(valueUm)} µm`;
}

export function plural(count: number, one: string, many: string): string {
  return `${count} ${count === 1 ? one : many}`;
}
