/**
 * The form speaks engineering units (MHz, µs); the API speaks SI (Hz, s). These are the only conversions.
 * They shift the decimal point in the number's shortest decimal text and parse once, so a typed 0.1 µs arrives
 * as the double nearest 1e-7 s. (0.1 / 1e6 and 50 × 1e-6 both round twice and miss it by one ulp.)
 */

/** x · 10^k, correctly rounded from x's shortest decimal form. */
export function shiftDecimal(x: number, k: number): number {
  if (!Number.isFinite(x)) return x;
  const [mantissa, exponent = "0"] = String(x).split("e");
  return Number(`${mantissa}e${Number(exponent) + k}`);
}

/** MHz → Hz. */
export const mhzToHz = (mhz: number): number => shiftDecimal(mhz, 6);
/** Hz → MHz. */
export const hzToMhz = (hz: number): number => shiftDecimal(hz, -6);
/** µs → s. */
export const usToS = (us: number): number => shiftDecimal(us, -6);
/** s → µs. */
export const sToUs = (s: number): number => shiftDecimal(s, 6);

/** A number input's value as the API wants it: empty (NaN from `valueAsNumber`) becomes "not given". */
export function given(n: number | undefined): number | undefined {
  return n === undefined || Number.isNaN(n) ? undefined : n;
}

/** Speed of light in vacuum, m/s (exact by the SI definition of the metre, 1983). */
export const SPEED_OF_LIGHT = 299_792_458;
