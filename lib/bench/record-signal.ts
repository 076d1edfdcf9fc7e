/**
 * The signal shape shared by the bench-record readers (EDF, CSV) and the analysis.
 */

export interface RecordSignal {
  /** Channel label as recorded. */
  label: string;
  /** Physical dimension as recorded ("uV", "mV", "V", ...). */
  physicalDimension: string;
  /** 'V' when `samples` were converted to volts; null when the dimension is not a voltage (samples then stay in `physicalDimension`). */
  siUnit: 'V' | null;
  sampleRateHz: number;
  /** Samples in volts (when `siUnit` is 'V'). */
  samples: Float64Array;
}

const voltFactors: Record<string, number> = {
  nv: 1e-9,
  uv: 1e-6,
  'µv': 1e-6,
  'μv': 1e-6,
  mv: 1e-3,
  v: 1,
  kv: 1e3,
};

/**
 * Volts per unit of a physical-dimension string ("uV" → 1e-6), or null when it is not a voltage.
 * Case-insensitive, so "UV" and "uv" are microvolts; "MV" is taken as millivolts, since megavolts
 * never occur in biopotential records.
 * @param dimension the dimension as written in the record
 */
export function voltsPerUnit(dimension: string): number | null {
  return voltFactors[dimension.trim().toLowerCase()] ?? null;
}
