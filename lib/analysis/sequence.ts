// Symmetrical components (Fortescue) of three phasors.

/** A complex number. */
export interface Phasor {
  re: number;
  im: number;
}

const A_RE = -0.5;
const A_IM = Math.sqrt(3) / 2; // a = e^{j120°}

function rotate(p: Phasor, re: number, im: number): Phasor {
  return { re: p.re * re - p.im * im, im: p.re * im + p.im * re };
}

/**
 * Splits phasors of phases a, b, c into zero, positive and negative sequence:
 * X0 = (Xa + Xb + Xc)/3, X1 = (Xa + a·Xb + a²·Xc)/3, X2 = (Xa + a²·Xb + a·Xc)/3, a = e^{j120°}
 * (Fortescue; any power-systems textbook, symmetrical components chapter). Applied per order,
 * so a balanced set's 5th harmonic shows as negative sequence and its 3rd as zero sequence.
 *
 * Complexity O(1).
 *
 * @example
 * // balanced positive sequence: b lags a by 120°
 * sequenceComponents({ re: 1, im: 0 }, { re: -0.5, im: -0.866 }, { re: -0.5, im: 0.866 }).positive // ≈ { re: 1, im: 0 }
 */
export function sequenceComponents(a: Phasor, b: Phasor, c: Phasor): { zero: Phasor; positive: Phasor; negative: Phasor } {
  const bA = rotate(b, A_RE, A_IM);
  const bA2 = rotate(b, A_RE, -A_IM);
  const cA = rotate(c, A_RE, A_IM);
  const cA2 = rotate(c, A_RE, -A_IM);
  return {
    zero: { re: (a.re + b.re + c.re) / 3, im: (a.im + b.im + c.im) / 3 },
    positive: { re: (a.re + bA.re + cA2.re) / 3, im: (a.im + bA.im + cA2.im) / 3 },
    negative: { re: (a.re + bA2.re + cA.re) / 3, im: (a.im + bA2.im + cA.im) / 3 },
  };
}
