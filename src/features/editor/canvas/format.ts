/** Numbers as the editor prints them (mono, with units). */

/** Up to 4 decimals, no trailing zeros: 0.3, 1.0625, −2. */
export function short(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  const s = (Math.round(x * 1e4) / 1e4 + 0).toString();
  return s === '-0' ? '0' : s;
}

/** The accessible name of key i (0-based): "Key 2, time 0.3 s, value 1.06 progress". */
export function keyName(i: number, time: number, value: number, unit: string): string {
  return `Key ${i + 1}, time ${short(time)} s, value ${short(value)}${unit ? ` ${unit}` : ''}`;
}
