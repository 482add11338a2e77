/** Input checks with messages that name the parameter (RangeError for values, TypeError for kinds). */

/** The largest signal the core accepts (2^22 samples), so a bad upload cannot exhaust memory. */
export const MAX_SAMPLES = 4_194_304;

export function checkFiniteNumber(name: string, value: unknown): asserts value is number {
  if (typeof value !== "number") throw new TypeError(`${name} must be a number, got ${typeof value}`);
  if (!Number.isFinite(value)) throw new RangeError(`${name} must be finite, got ${value}`);
}

export function checkInteger(
  name: string,
  value: unknown,
  min: number,
  max: number,
): asserts value is number {
  checkFiniteNumber(name, value);
  if (!Number.isInteger(value)) throw new RangeError(`${name} must be an integer, got ${value}`);
  if (value < min || value > max) throw new RangeError(`${name} must be in ${min}..${max}, got ${value}`);
}

export function checkRange(
  name: string,
  value: unknown,
  min: number,
  max: number,
  opts?: { exclusiveMin?: boolean },
) {
  checkFiniteNumber(name, value);
  const low = opts?.exclusiveMin ? value <= min : value < min;
  if (low || value > max)
    throw new RangeError(`${name} must be in ${opts?.exclusiveMin ? "(" : "["}${min}, ${max}], got ${value}`);
}

/** A typed or plain array of finite numbers, 1..MAX_SAMPLES long. */
export function checkSamples(name: string, values: ArrayLike<number>, opts?: { allowEmpty?: boolean }) {
  if (
    values == null ||
    typeof values !== "object" ||
    typeof (values as ArrayLike<number>).length !== "number"
  )
    throw new TypeError(`${name} must be an array of numbers`);
  const n = values.length;
  if (n === 0 && !opts?.allowEmpty) throw new RangeError(`${name} must not be empty`);
  if (n > MAX_SAMPLES) throw new RangeError(`${name} has ${n} samples; at most ${MAX_SAMPLES} are allowed`);
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (typeof v !== "number" || !Number.isFinite(v))
      throw new RangeError(`${name}[${i}] must be a finite number, got ${String(v)}`);
  }
}

export function checkSignal(name: string, s: { re: ArrayLike<number>; im: ArrayLike<number> }) {
  if (!s || typeof s !== "object") throw new TypeError(`${name} must be a signal {re, im}`);
  checkSamples(`${name}.re`, s.re);
  checkSamples(`${name}.im`, s.im);
  if (s.re.length !== s.im.length)
    throw new RangeError(`${name}.re and ${name}.im differ in length (${s.re.length} vs ${s.im.length})`);
}
