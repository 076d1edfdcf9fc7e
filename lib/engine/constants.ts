/** Physical constants (CODATA 2018; exact in the 2019 SI). */

/** Boltzmann constant, J/K (CODATA 2018, exact). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;

/** Peak-to-peak ÷ rms for Gaussian noise: 6.6 (≈ 0.1 % exceedance; common practice, no source). */
export const NOISE_PP_PER_RMS = 6.6;

/** Peak-to-peak ÷ rms of a sine wave, 2√2. */
export const SINE_PP_PER_RMS = 2 * Math.SQRT2;

/** Within this relative distance of a limit a check is 'marginal' (our convention). */
export const MARGINAL_FRACTION = 0.1;

/** Common-mode input resistance assumed when the plan gives none, Ω (common practice, no source). */
export const DEFAULT_INPUT_CM_OHM = 1e12;
/** Common-mode input capacitance assumed when the plan gives none, F (common practice, no source). */
export const DEFAULT_INPUT_CM_F = 3e-12;
/** Spread of the op-amps' gain-bandwidth between the two input amplifiers, fraction (assumption, common practice, no source). */
export const GBW_SPREAD = 0.2;
