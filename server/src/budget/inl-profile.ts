// One board's integral nonlinearity (INL) as a fixed function of the code, for the Monte Carlo.
//
// A converter's datasheet states only a bound, |INL| <= L LSB over every code and every part. On a
// built board the INL is a fixed curve of the code, mostly smooth (bow and S shapes from the
// mismatch of the capacitor array or resistor string; the code-to-code fine structure is DNL and is
// left to the quantisation term): two readings at nearby codes share it, and a calibration removes
// it at the calibration code. Drawing it afresh at every reading would let calibration remove
// nothing and would make neighbouring temperatures disagree as no board does.
//
// The model (ours; common practice, no source for the shape): per board
//   P(x) = A (w1 sin(pi x) + w2 sin(2 pi x) + w3 sin(3 pi x)) / (|w1| + |w2| + |w3|),  x = code / 2^bits,
// with w1..w3 uniform in [-1, 1] and the amplitude A drawn like every other tolerance (uniform in
// [-1, 1], or normal with the bound at 3 sigma). Why this form: the three lowest sine terms are the
// simplest smooth shapes (bow, S, and one more swing) that vanish at both ends of the scale, as INL
// does under its end-point definition; dividing by the sum of |w| keeps |P| <= |A| <= 1, so the stated
// bound holds everywhere. The reading's INL error is then L P(x) LSB.
//
// The worst case does not use this shape: it takes the INL at each reading (and at each calibration
// reading) anywhere within +-L, which is the bound over every profile the datasheet allows.
import type { Xoshiro128 } from './prng';

export class InlProfile {
  private a = 0;
  private w1 = 0;
  private w2 = 0;
  private w3 = 0;

  /** Draws a new board's profile (four numbers from the generator). */
  draw(rng: Xoshiro128, distribution: 'uniform' | 'normal'): void {
    const amp = rng.draw(distribution);
    const w1 = rng.symmetric();
    const w2 = rng.symmetric();
    const w3 = rng.symmetric();
    const sum = Math.abs(w1) + Math.abs(w2) + Math.abs(w3);
    this.a = sum > 0 ? amp / sum : 0;
    this.w1 = w1;
    this.w2 = w2;
    this.w3 = w3;
  }

  /** P at x = code / 2^bits (clamped to the scale), in [-1, 1]. */
  at(x: number): number {
    const t = Math.PI * Math.min(1, Math.max(0, x));
    return this.a * (this.w1 * Math.sin(t) + this.w2 * Math.sin(2 * t) + this.w3 * Math.sin(3 * t));
  }
}
