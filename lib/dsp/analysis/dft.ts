import FFT from "fft.js";

/**
 * A DFT of fixed length n ≥ 2 for real input: X[k] = Σ x[m]·e^{−j2πkm/n}, returned as interleaved
 * [re0, im0, re1, im1, …] for k = 0 … ⌊n/2⌋. Powers of two go straight to fft.js (radix-4);
 * any other n uses Bluestein's chirp-z algorithm (Bluestein 1970, IEEE Trans. AU-18) on an fft.js
 * transform of the next power of two ≥ 2n − 1.
 */
export function makeRealDft(n: number): (x: Float64Array) => Float64Array {
  if (!Number.isInteger(n) || n < 2) throw new Error(`DFT length must be an integer ≥ 2 (got ${n})`);
  const bins = Math.floor(n / 2) + 1;
  if ((n & (n - 1)) === 0) {
    const fft = new FFT(n);
    const out = fft.createComplexArray() as number[];
    // realTransform fills bins 0 … n/2, the ones returned (fft.js leaves the mirrored half unset).
    return (x) => {
      fft.realTransform(out, x);
      return Float64Array.from(out.slice(0, 2 * bins));
    };
  }
  return bluestein(n, bins);
}

function bluestein(n: number, bins: number): (x: Float64Array) => Float64Array {
  let m = 1;
  while (m < 2 * n - 1) m *= 2;
  const fft = new FFT(m);
  // Chirp w[k] = e^{−jπk²/n}; k² is reduced mod 2n so the angle stays exact for large k.
  const chirpRe = new Float64Array(n);
  const chirpIm = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const angle = (Math.PI * ((k * k) % (2 * n))) / n;
    chirpRe[k] = Math.cos(angle);
    chirpIm[k] = -Math.sin(angle);
  }
  const kernel = new Array<number>(2 * m).fill(0);
  for (let k = 0; k < n; k++) {
    kernel[2 * k] = chirpRe[k];
    kernel[2 * k + 1] = -chirpIm[k];
    if (k > 0) {
      kernel[2 * (m - k)] = chirpRe[k];
      kernel[2 * (m - k) + 1] = -chirpIm[k];
    }
  }
  const kernelSpectrum = fft.createComplexArray() as number[];
  fft.transform(kernelSpectrum, kernel);
  const a = new Array<number>(2 * m);
  const spectrum = fft.createComplexArray() as number[];
  const conv = fft.createComplexArray() as number[];
  return (x) => {
    a.fill(0);
    for (let k = 0; k < n; k++) {
      a[2 * k] = x[k] * chirpRe[k];
      a[2 * k + 1] = x[k] * chirpIm[k];
    }
    fft.transform(spectrum, a);
    for (let i = 0; i < m; i++) {
      const re = spectrum[2 * i] * kernelSpectrum[2 * i] - spectrum[2 * i + 1] * kernelSpectrum[2 * i + 1];
      const im = spectrum[2 * i] * kernelSpectrum[2 * i + 1] + spectrum[2 * i + 1] * kernelSpectrum[2 * i];
      spectrum[2 * i] = re;
      spectrum[2 * i + 1] = im;
    }
    fft.inverseTransform(conv, spectrum);
    const out = new Float64Array(2 * bins);
    for (let k = 0; k < bins; k++) {
      const re = conv[2 * k];
      const im = conv[2 * k + 1];
      out[2 * k] = re * chirpRe[k] - im * chirpIm[k];
      out[2 * k + 1] = re * chirpIm[k] + im * chirpRe[k];
    }
    return out;
  };
}
