"""Reference computations with SciPy for the Channelsmith engine tests.

Reads one JSON object {"requests": [...]} on stdin and writes {"versions": ..., "results": [...]}
on stdout. Run with /usr/bin/python3 (Debian python3-scipy). Each request has a "kind":
  lowpass   {family: butterworth|bessel, order, fcHz, fHz: [...]}  analog filter response
  highpass  {order, fcHz, fHz: [...]}                             Butterworth analog high-pass
  poles     {family, order}                                      normalized poles (-3 dB at 1 rad/s)
  enbw      {family, order}                                      noise bandwidth / fc by quad()
  lsim      {hpOrder, fcHz, amplitudeV, widthS, delayS, durationS, stepS}  rectangular pulse through
            the Butterworth high-pass: largest |y| and |dy/dt| after the pulse, and t, y (thinned)
"""
import json
import sys

import numpy as np
import scipy
from scipy import integrate, signal


def analog_lowpass(family, order, wc):
    if family == "butterworth":
        return signal.butter(order, wc, btype="low", analog=True, output="zpk")
    if family == "bessel":
        return signal.bessel(order, wc, btype="low", analog=True, output="zpk", norm="mag")
    raise ValueError("unknown family " + family)


def response(zpk, f_hz):
    w = 2 * np.pi * np.asarray(f_hz, dtype=float)
    _, h = signal.freqs_zpk(*zpk, worN=w)
    return h


def handle(req):
    kind = req["kind"]
    if kind == "lowpass":
        h = response(analog_lowpass(req["family"], req["order"], 2 * np.pi * req["fcHz"]), req["fHz"])
        return {"re": h.real.tolist(), "im": h.imag.tolist()}
    if kind == "highpass":
        zpk = signal.butter(req["order"], 2 * np.pi * req["fcHz"], btype="high", analog=True, output="zpk")
        h = response(zpk, req["fHz"])
        return {"re": h.real.tolist(), "im": h.imag.tolist()}
    if kind == "poles":
        _, p, _ = analog_lowpass(req["family"], req["order"], 1.0)
        return {"re": p.real.tolist(), "im": p.imag.tolist()}
    if kind == "enbw":
        z, p, k = analog_lowpass(req["family"], req["order"], 1.0)
        b, a = signal.zpk2tf(z, p, k)

        def mag2(f):
            _, h = signal.freqs(b, a, worN=[2 * np.pi * f])
            return abs(h[0]) ** 2

        value, _ = integrate.quad(mag2, 0, np.inf, limit=500)
        # corner at 1 rad/s = 1/(2 pi) Hz: noise bandwidth divided by the corner
        return {"ratio": value * 2 * np.pi}
    if kind == "lsim":
        zpk = signal.butter(req["hpOrder"], 2 * np.pi * req["fcHz"], btype="high", analog=True, output="zpk")
        system = signal.ZerosPolesGain(*zpk)
        t = np.arange(0, req["durationS"] + req["stepS"] / 2, req["stepS"])
        u = np.where((t >= req["delayS"]) & (t < req["delayS"] + req["widthS"]), req["amplitudeV"], 0.0)
        _, y, _ = signal.lsim(system, u, t)
        # lsim interpolates the input linearly between samples, so the falling edge is a one-step
        # ramp: measure from the first sample after it.
        end = req["delayS"] + req["widthS"]
        after = np.nonzero(t > end + req["stepS"] / 2)[0]
        ya = y[after]
        displacement = float(np.max(np.abs(ya)))
        slope = float(np.max(np.abs(np.diff(ya)))) / req["stepS"]
        every = max(1, len(t) // 2000)
        return {"displacementV": displacement, "slopeVPerS": slope, "t": t[::every].tolist(), "y": y[::every].tolist()}
    raise ValueError("unknown request kind " + kind)


def main():
    payload = json.load(sys.stdin)
    results = [handle(r) for r in payload["requests"]]
    json.dump({"versions": {"scipy": scipy.__version__, "numpy": np.__version__}, "results": results}, sys.stdout)


if __name__ == "__main__":
    main()
