/**
 * A finite number in plain decimal notation, never in exponent form, as XML Schema's
 * `xsd:decimal` (W3C XML Schema Part 2, §3.2.3) requires for GPX coordinates: the shortest text
 * that reads back as the same double when JavaScript prints it without an exponent, else up to
 * 12 decimals (well below a millimetre in degrees) with trailing zeros removed.
 *
 * @param value - a finite number
 * @returns e.g. "45.764043", "-0.000001", "0"
 * @throws RangeError when the value is not finite
 * @example decimalText(1e-7) // => "0.0000001"
 */
export function decimalText(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`decimalText: ${value} is not a finite number`);
  if (Object.is(value, -0)) return "0";
  const plain = String(value);
  if (!/e/i.test(plain)) return plain;
  const fixed = value.toFixed(12).replace(/\.?0+$/, "");
  return fixed === "-0" ? "0" : fixed;
}
