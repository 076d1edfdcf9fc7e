/**
 * The caution Channelsmith shows on every signed-in page and carries in every export. One constant,
 * word for word as the product states it; it never claims compliance.
 */
export const planningAidCaution =
  'Channelsmith is a planning aid, not a certification. The device must be verified by test to IEC 60601-1 and the applicable particular standards; local regulations and qualified engineers decide. Patient leakage and defibrillation protection must be designed and tested separately.';
