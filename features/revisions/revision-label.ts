/**
 * Revision labels: A, B, …, Z, AA, AB, … (bijective base 26, as spreadsheet columns are named),
 * one per frozen revision of a plan, in order.
 */

/** Largest sequence number a three-letter label can hold (26 + 26² + 26³). */
export const maxRevisionSequence = 26 + 26 * 26 + 26 * 26 * 26;

/**
 * The label of the n-th revision of a plan.
 * @param sequence 1 for the first revision, 2 for the second, … (a whole number from 1 to 18 278)
 * @returns "A" for 1, "Z" for 26, "AA" for 27, "ZZZ" for 18 278
 * @throws RangeError for anything else
 * @example revisionLabel(28) // "AB"
 */
export function revisionLabel(sequence: number): string {
  if (!Number.isInteger(sequence) || sequence < 1 || sequence > maxRevisionSequence) {
    throw new RangeError(`revision sequence must be a whole number from 1 to ${maxRevisionSequence}, got ${sequence}`);
  }
  let n = sequence;
  let label = '';
  while (n > 0) {
    const digit = (n - 1) % 26;
    label = String.fromCharCode(65 + digit) + label;
    n = Math.floor((n - 1) / 26);
  }
  return label;
}
