import { describe, expect, it } from 'vitest';
import { integrateRmsV, oneOverFNoiseRmsV, thermalNoiseDensityVPerRtHz } from '@/lib/engine/noise';
import { lowPassMagnitudeSquared } from '@/lib/engine/filters';
import { evaluate } from '@/lib/engine/evaluate';
import { expectClose } from './close';
import patch from '@/lib/engine/demo-plans/wearable-ecg-patch.json';

describe('noise', () => {
  // Thermal noise of 1 kΩ: 4.058 nV/√Hz at 25 °C and 4.07 nV/√Hz at 27 °C (engine notes; √(4kTR), CODATA k).
  it('gives the thermal noise of 1 kΩ', () => {
    expectClose(thermalNoiseDensityVPerRtHz(1e3, 298.15), 4.058e-9, 5e-4, '1 kΩ at 298.15 K');
    expectClose(thermalNoiseDensityVPerRtHz(1e3, 300), 4.07e-9, 1e-3, '1 kΩ at 300 K');
  });

  // Kester, ADI tutorial MT-048: e_n = 10 nV/√Hz, f_c = 10 Hz over 0.1–10 Hz → 74.8 nV rms.
  it('integrates 1/f noise like the Kester worked example', () => {
    expectClose(oneOverFNoiseRmsV(10e-9, 10, 0.1, 10), 74.8e-9, 1e-3, 'closed form');
    const numeric = integrateRmsV((f) => 1e-16 * (1 + 10 / f), 0.1, 10, 400);
    expectClose(numeric, 74.8e-9, 1e-3, 'numeric integration');
  });

  // Noise through a Butterworth low-pass: rms = e·√(ENBW), ENBW/fc = 1.1107 for order 2 (Winder).
  it('integrates white noise through a filter to the noise bandwidth', () => {
    const rms = integrateRmsV((f) => 1e-16 * lowPassMagnitudeSquared('butterworth', 2, 100, f), 1e-3, 1e6, 2000);
    expectClose(rms, 1e-8 * Math.sqrt(1.1107 * 100), 1e-3, 'rms through order-2 Butterworth');
  });

  it('reports contributions whose shares add to one and whose powers add to the total', () => {
    const n = evaluate(patch).noise;
    const shares = n.contributions.reduce((s, c) => s + c.share, 0);
    expectClose(shares, 1, 1e-12, 'sum of shares');
    expectClose(Math.sqrt(n.contributions.reduce((s, c) => s + c.rmsV ** 2, 0)), n.rtiRmsV, 1e-12, 'root-sum-square');
    expectClose(n.rtiPpV, 6.6 * n.rtiRmsV, 1e-12, 'p-p = 6.6 × rms (common practice)');
    expect(n.floorRmsV).toBeLessThanOrEqual(n.rtiRmsV);
  });

  it('moves with the temperature of the plan', () => {
    const cold = evaluate({ ...patch, temperatureK: 250 }).noise.contributions[0].rmsV;
    const warm = evaluate({ ...patch, temperatureK: 350 }).noise.contributions[0].rmsV;
    expectClose(warm / cold, Math.sqrt(350 / 250), 1e-9, 'electrode thermal noise ∝ √T');
  });
});
