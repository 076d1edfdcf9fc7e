/**
 * Small complex-number helpers for frequency responses. Pure, no allocation
 * beyond the returned object. Angles in radians unless the name says degrees.
 */

/** A complex number re + j·im (dimensionless unless the caller says otherwise). */
export type Complex = { re: number; im: number };

/** Creates a complex number. @example complex(1, 2) → { re: 1, im: 2 } */
export function complex(re: number, im = 0): Complex {
  return { re, im };
}

/** Product a·b. @example multiply({re:0,im:1},{re:0,im:1}) → { re: -1, im: 0 } */
export function multiply(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/** Quotient a/b (b ≠ 0). @example divide({re:1,im:0},{re:0,im:1}) → { re: 0, im: -1 } */
export function divide(a: Complex, b: Complex): Complex {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}

/** Sum a + b. */
export function add(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

/** Difference a − b. */
export function subtract(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/** Scales a complex number by a real factor. */
export function scale(a: Complex, k: number): Complex {
  return { re: a.re * k, im: a.im * k };
}

/** Reciprocal 1/a. */
export function reciprocal(a: Complex): Complex {
  const d = a.re * a.re + a.im * a.im;
  return { re: a.re / d, im: -a.im / d };
}

/**
 * Magnitude |a|. @example magnitude({re:3,im:4}) → 5
 * √(re² + im²) rather than Math.hypot, which guards against overflow the responses here never
 * reach (|re|, |im| far inside 1e±150) and is several times slower in the engines we run on.
 */
export function magnitude(a: Complex): number {
  return Math.sqrt(a.re * a.re + a.im * a.im);
}

/** Squared magnitude |a|². */
export function magnitudeSquared(a: Complex): number {
  return a.re * a.re + a.im * a.im;
}

/** Argument of a in degrees, in (−180, 180]. */
export function phaseDeg(a: Complex): number {
  return (Math.atan2(a.im, a.re) * 180) / Math.PI;
}

/**
 * Argument of re + j·im in degrees, in (−180, 180]: `phaseDeg` without the object, equal to it up
 * to rounding (a few units in the last place). Off the axes as atan(im/re), moved by ±π into the
 * left half-plane (the quadrant rule of atan2, which costs about twice as much as atan in the
 * engines we run on); on the axes atan2 itself.
 * @example argumentDeg(-1, 1) → 135
 */
export function argumentDeg(re: number, im: number): number {
  let rad: number;
  if (im === 0 || re === 0) rad = Math.atan2(im, re);
  else if (re > 0) rad = Math.atan(im / re);
  else rad = Math.atan(im / re) + (im > 0 ? Math.PI : -Math.PI);
  return (rad * 180) / Math.PI;
}

/** Parallel combination a∥b = a·b/(a+b) of two impedances. */
export function parallel(a: Complex, b: Complex): Complex {
  return divide(multiply(a, b), add(a, b));
}

/** Converts a magnitude ratio to decibels (20·log10). @example ratioToDb(10) → 20 */
export function ratioToDb(ratio: number): number {
  return 20 * Math.log10(ratio);
}

/** 10/ln 10, dB per unit of ln(power ratio). */
const DB_PER_NATURAL_LOG = 10 / Math.LN10;

/**
 * Converts a power ratio, such as |H|², to decibels (10·log10): the same value as `ratioToDb` of
 * its square root, without the root. @example powerRatioToDb(100) → 20
 */
export function powerRatioToDb(ratioSquared: number): number {
  // 10·log10 x = (10/ln 10)·ln x: Math.log is about twice as fast as Math.log10 in the engines we run on.
  return DB_PER_NATURAL_LOG * Math.log(ratioSquared);
}

/** Converts decibels to a magnitude ratio (10^(dB/20)). @example dbToRatio(20) → 10 */
export function dbToRatio(db: number): number {
  return 10 ** (db / 20);
}
