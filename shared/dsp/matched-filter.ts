/**
 * Matched (and weighted, mismatched) receive filter: h[n] = w[n]·conj(s[N−1−n]) — the time-reversed conjugate of
 * the waveform (Richards, "Fundamentals of Radar Signal Processing", 2nd ed., 2014, §4.4), optionally tapered by a
 * symmetric window for sidelobe control (ibid. §4.7.2), so that y = x ∗ h correlates the input with the waveform.
 */
import { checkSignal } from "./check";
import type { ComplexSignal } from "./types";
import { makeWindow, type WindowSpec } from "./windows";

/** The receive filter for waveform `s`, weighted by `window` (rectangular, i.e. the ideal matched filter, by default). */
export function matchedFilter(s: ComplexSignal, window?: WindowSpec): ComplexSignal {
  checkSignal("s", s);
  const n = s.re.length;
  const w = window ? makeWindow(window, n) : null;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const g = w ? w[i]! : 1;
    re[i] = g * s.re[n - 1 - i]!;
    // 0 − x would give −0 for x = 0; keep +0 so real waveforms give an all-(+0) imaginary part.
    const q = s.im[n - 1 - i]!;
    im[i] = q === 0 ? 0 : -g * q;
  }
  return { re, im };
}
