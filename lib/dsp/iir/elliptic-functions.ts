/**
 * Complete and incomplete elliptic integrals of the first kind, Jacobi elliptic functions and the
 * elliptic degree equation, all in terms of the parameter m = k² (unitless; u in the same units as K).
 */

/** Carlson's r: the truncation error of the series below is about r relative. */
const RF_TOLERANCE = 1e-16;

/**
 * Carlson's symmetric integral R_F(x, y, z) by the duplication theorem
 * (Carlson 1995, Numer. Algorithms 10:13–26, Algorithm 1; DLMF 19.36.1).
 */
export function carlsonRf(x: number, y: number, z: number): number {
  if (!(x >= 0 && y >= 0 && z >= 0) || x + y === 0 || x + z === 0 || y + z === 0) {
    throw new Error(`carlsonRf needs x, y, z ≥ 0 with at most one zero (got ${x}, ${y}, ${z})`);
  }
  let [xn, yn, zn] = [x, y, z];
  let mean = (xn + yn + zn) / 3;
  const q = Math.max(Math.abs(mean - xn), Math.abs(mean - yn), Math.abs(mean - zn)) / (3 * RF_TOLERANCE) ** (1 / 6);
  let scale = 1;
  while (q * scale > Math.abs(mean)) {
    const lambda = Math.sqrt(xn) * Math.sqrt(yn) + Math.sqrt(xn) * Math.sqrt(zn) + Math.sqrt(yn) * Math.sqrt(zn);
    xn = (xn + lambda) / 4;
    yn = (yn + lambda) / 4;
    zn = (zn + lambda) / 4;
    mean = (mean + lambda) / 4;
    scale /= 4;
  }
  const dx = ((x + y + z) / 3 - x) * scale / mean;
  const dy = ((x + y + z) / 3 - y) * scale / mean;
  const dz = -(dx + dy);
  const e2 = dx * dy - dz * dz;
  const e3 = dx * dy * dz;
  return (1 - e2 / 10 + e3 / 14 + (e2 * e2) / 24 - (3 * e2 * e3) / 44) / Math.sqrt(mean);
}

function requireParameter(m: number, upper: "open" | "closed"): void {
  const ok = upper === "open" ? m >= 0 && m < 1 : m >= 0 && m <= 1;
  if (!ok) throw new Error(`elliptic parameter m must be in [0, 1${upper === "open" ? ")" : "]"} (got ${m})`);
}

/** Complete elliptic integral K(m) = R_F(0, 1 − m, 1), 0 ≤ m < 1 (DLMF 19.25.1). */
export function ellipK(m: number): number {
  requireParameter(m, "open");
  return carlsonRf(0, 1 - m, 1);
}

/** K(1 − m1) computed without forming 1 − m1, 0 < m1 ≤ 1 (DLMF 19.25.1; scipy.special.ellipkm1 meaning). */
export function ellipKm1(m1: number): number {
  if (!(m1 > 0 && m1 <= 1)) throw new Error(`ellipKm1 needs 0 < m1 ≤ 1 (got ${m1})`);
  return carlsonRf(0, m1, 1);
}

/**
 * Incomplete elliptic integral F(φ | 1 − m1) for 0 ≤ φ ≤ π/2, from the complementary parameter m1
 * so that m close to 1 keeps full precision (DLMF 19.25.5).
 */
export function ellipFComplement(phi: number, m1: number): number {
  if (!(phi >= 0 && phi <= Math.PI / 2)) throw new Error(`φ must be in [0, π/2] (got ${phi})`);
  requireParameter(m1, "closed");
  const s = Math.sin(phi);
  const c = Math.cos(phi);
  if (s === 0) return 0;
  return s * carlsonRf(c * c, c * c + m1 * s * s, 1);
}

const AGM_MAX_STEPS = 8;

/**
 * Jacobi elliptic functions sn, cn, dn of u with parameter m, 0 ≤ m ≤ 1, by the descending
 * arithmetic–geometric mean (Abramowitz & Stegun 16.4; the Cephes ellpj algorithm scipy.special uses),
 * with A&S 16.13 (m near 0) and 16.15 (m near 1) series at the ends.
 */
export function jacobiSnCnDn(u: number, m: number): { sn: number; cn: number; dn: number } {
  requireParameter(m, "closed");
  if (m < 1e-9) {
    const t = Math.sin(u);
    const b = Math.cos(u);
    const ai = 0.25 * m * (u - t * b);
    return { sn: t - ai * b, cn: b + ai * t, dn: 1 - 0.5 * m * t * t };
  }
  if (m >= 0.9999999999) {
    const ai = 0.25 * (1 - m);
    const b = Math.cosh(u);
    const t = Math.tanh(u);
    const phi = 1 / b;
    const twon = b * Math.sinh(u);
    return {
      sn: t + (ai * (twon - u)) / (b * b),
      cn: phi - ai * t * phi * (twon - u),
      dn: phi + ai * t * phi * (twon + u),
    };
  }
  const a = [1];
  const c = [Math.sqrt(m)];
  let b = Math.sqrt(1 - m);
  let twon = 1;
  let i = 0;
  while (Math.abs(c[i] / a[i]) > Number.EPSILON / 2 && i < AGM_MAX_STEPS) {
    const ai = a[i];
    i++;
    c[i] = (ai - b) / 2;
    const t = Math.sqrt(ai * b);
    a[i] = (ai + b) / 2;
    b = t;
    twon *= 2;
  }
  let phi = twon * a[i] * u;
  let previous = phi;
  for (; i > 0; i--) {
    const t = (c[i] * Math.sin(phi)) / a[i];
    previous = phi;
    phi = (Math.asin(t) + phi) / 2;
  }
  const cn = Math.cos(phi);
  return { sn: Math.sin(phi), cn, dn: cn / Math.cos(phi - previous) };
}

const DEGREE_SERIES_TERMS = 7;

/**
 * Solves the degree equation N·K'(m1)/K(m1) = K'(m)/K(m) for m by nome series
 * (S. J. Orfanidis, notes on elliptic filter design, Rutgers University, 2006, eq. (49); scipy.signal _ellipdeg):
 * m = 16q·(Σ q^{k(k+1)} / (1 + 2Σ q^{k²}))⁴ with q = q1^{1/N}, q1 = exp(−π K'(m1)/K(m1)).
 */
export function ellipdeg(order: number, m1: number): number {
  const k1 = ellipK(m1);
  const k1p = ellipKm1(m1);
  const q1 = Math.exp((-Math.PI * k1p) / k1);
  const q = q1 ** (1 / order);
  let num = 0;
  for (let k = 0; k <= DEGREE_SERIES_TERMS; k++) num += q ** (k * (k + 1));
  let den = 0;
  for (let k = 1; k <= DEGREE_SERIES_TERMS + 1; k++) den += q ** (k * k);
  return 16 * q * (num / (1 + 2 * den)) ** 4;
}
