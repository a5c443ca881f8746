/**
 * Exact decimal arithmetic for the few places where the published tables' rounding matters.
 *
 * BS 7671's tables round half-up to two decimals (2.185 → 2.19). Binary floating point cannot do
 * that reliably: 0.95 × 230 / 1000 is 0.2185 on paper but 0.21849999… as a double, which rounds to
 * 0.21 instead of the table's 0.22. Values are therefore taken as the decimal text JavaScript prints
 * for them (the shortest text that reads back to the same double, e.g. `0.95`), held as a BigInt
 * coefficient and a power of ten, and divided and rounded exactly.
 */

/** A decimal value `coefficient × 10^-scale`. */
export interface Decimal {
  coefficient: bigint;
  scale: number;
}

const TEN = 10n;

function powerOfTen(n: number): bigint {
  return TEN ** BigInt(n);
}

/**
 * The decimal a finite number stands for, read from its shortest printed form (`0.95` → 95 × 10^-2).
 * Returns null for NaN and ±Infinity.
 */
export function toDecimal(value: number): Decimal | null {
  if (!Number.isFinite(value)) return null;
  const text = String(value);
  const exponentAt = text.search(/e/i);
  const mantissa = exponentAt === -1 ? text : text.slice(0, exponentAt);
  const exponent = exponentAt === -1 ? 0 : Number(text.slice(exponentAt + 1));
  const negative = mantissa.startsWith('-');
  const unsigned = negative ? mantissa.slice(1) : mantissa;
  const point = unsigned.indexOf('.');
  const digits = point === -1 ? unsigned : unsigned.slice(0, point) + unsigned.slice(point + 1);
  let scale = (point === -1 ? 0 : unsigned.length - point - 1) - exponent;
  let coefficient = BigInt(digits);
  if (scale < 0) {
    coefficient *= powerOfTen(-scale);
    scale = 0;
  }
  return { coefficient: negative ? -coefficient : coefficient, scale };
}

/** The exact product of two decimals. */
export function multiplyDecimal(a: Decimal, b: Decimal): Decimal {
  return { coefficient: a.coefficient * b.coefficient, scale: a.scale + b.scale };
}

/**
 * a ÷ b rounded half-up (away from zero on a tie) to `places` decimals, returned as a number whose
 * printed form is that rounded decimal. Returns NaN when b is zero.
 */
export function divideRoundHalfUp(a: Decimal, b: Decimal, places: number): number {
  if (b.coefficient === 0n) return Number.NaN;
  // a/b × 10^places = a.c × 10^(b.s + places) / (b.c × 10^a.s)
  let numerator = a.coefficient * powerOfTen(b.scale + places);
  let denominator = b.coefficient * powerOfTen(a.scale);
  if (denominator < 0n) {
    numerator = -numerator;
    denominator = -denominator;
  }
  const negative = numerator < 0n;
  const magnitude = negative ? -numerator : numerator;
  const rounded = (2n * magnitude + denominator) / (2n * denominator);
  return Number(`${negative ? '-' : ''}${rounded}e-${places}`);
}

/** A number rounded half-up to `places` decimals, exactly as its printed decimal reads (1.096 → 1.10). */
export function roundHalfUp(value: number, places: number): number {
  const decimal = toDecimal(value);
  if (decimal === null) return value;
  return divideRoundHalfUp(decimal, { coefficient: 1n, scale: 0 }, places);
}

/** A number shown with exactly `places` decimals, rounded half-up (0.2185 → "0.22"). */
export function formatFixed(value: number, places: number): string {
  if (!Number.isFinite(value)) return String(value);
  const text = String(value);
  if (text.includes('e')) return roundHalfUp(value, places).toFixed(places);
  // Round the printed decimal digits directly: cheaper than BigInt, and the same rule.
  const negative = text.startsWith('-');
  const unsigned = negative ? text.slice(1) : text;
  const point = unsigned.indexOf('.');
  const whole = point === -1 ? unsigned : unsigned.slice(0, point);
  const fraction = point === -1 ? '' : unsigned.slice(point + 1);
  let digits = whole + fraction.padEnd(places, '0').slice(0, places);
  if (fraction.length > places && fraction.charCodeAt(places) >= 53 /* '5' */) digits = incrementDigits(digits);
  const cut = digits.length - places;
  const result = places === 0 ? digits : `${digits.slice(0, cut)}.${digits.slice(cut)}`;
  return negative && /[1-9]/.test(result) ? `-${result}` : result;
}

/** Adds one to a string of decimal digits ("0999" → "1000", "99" → "100"). */
function incrementDigits(digits: string): string {
  const chars = digits.split('');
  for (let i = chars.length - 1; i >= 0; i--) {
    if (chars[i] === '9') {
      chars[i] = '0';
    } else {
      chars[i] = String.fromCharCode(chars[i]!.charCodeAt(0) + 1);
      return chars.join('');
    }
  }
  return `1${chars.join('')}`;
}
