/**
 * The caution every export carries, on the first page and in every page footer of the PDF and in
 * the JSON. Kept word for word as the product states it; the wording never claims compliance.
 */
export const RATIONALE_CAUTION =
  'Channelsmith is a planning aid, not a certification. The device must be verified by test to IEC 60601-1 and the applicable particular standards; local regulations and qualified engineers decide. Patient leakage and defibrillation protection must be designed and tested separately.';
