/**
 * Bounded scalar minimiser: Brent's golden-section search with parabolic steps (Brent, "Algorithms for
 * Minimization without Derivatives", 1973, ch. 5), step for step as scipy.optimize.fminbound (xatol 1e-5,
 * at most 500 evaluations) so that the order estimators reproduce scipy's band-stop edges exactly.
 */
export function fminbound(f: (x: number) => number, lower: number, upper: number, xatol = 1e-5, maxEvaluations = 500): number {
  if (!(Number.isFinite(lower) && Number.isFinite(upper) && lower <= upper)) {
    throw new Error(`fminbound needs finite bounds with lower ≤ upper (got ${lower}, ${upper})`);
  }
  const sqrtEps = Math.sqrt(2.2e-16);
  const goldenMean = 0.5 * (3 - Math.sqrt(5));
  let a = lower;
  let b = upper;
  let fulc = a + goldenMean * (b - a);
  let nfc = fulc;
  let xf = fulc;
  let rat = 0;
  let e = 0;
  let x = xf;
  let fx = f(x);
  let evaluations = 1;
  let ffulc = fx;
  let fnfc = fx;
  let xm = 0.5 * (a + b);
  let tol1 = sqrtEps * Math.abs(xf) + xatol / 3;
  let tol2 = 2 * tol1;
  while (Math.abs(xf - xm) > tol2 - 0.5 * (b - a)) {
    let golden = true;
    if (Math.abs(e) > tol1) {
      golden = false;
      let r = (xf - nfc) * (fx - ffulc);
      let q = (xf - fulc) * (fx - fnfc);
      let p = (xf - fulc) * q - (xf - nfc) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      q = Math.abs(q);
      r = e;
      e = rat;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - xf) && p < q * (b - xf)) {
        rat = p / q;
        x = xf + rat;
        if (x - a < tol2 || b - x < tol2) rat = tol1 * (Math.sign(xm - xf) + (xm - xf === 0 ? 1 : 0));
      } else {
        golden = true;
      }
    }
    if (golden) {
      e = xf >= xm ? a - xf : b - xf;
      rat = goldenMean * e;
    }
    const si = Math.sign(rat) + (rat === 0 ? 1 : 0);
    x = xf + si * Math.max(Math.abs(rat), tol1);
    const fu = f(x);
    evaluations++;
    if (fu <= fx) {
      if (x >= xf) a = xf;
      else b = xf;
      [fulc, ffulc] = [nfc, fnfc];
      [nfc, fnfc] = [xf, fx];
      [xf, fx] = [x, fu];
    } else {
      if (x < xf) a = x;
      else b = x;
      if (fu <= fnfc || nfc === xf) {
        [fulc, ffulc] = [nfc, fnfc];
        [nfc, fnfc] = [x, fu];
      } else if (fu <= ffulc || fulc === xf || fulc === nfc) {
        [fulc, ffulc] = [x, fu];
      }
    }
    xm = 0.5 * (a + b);
    tol1 = sqrtEps * Math.abs(xf) + xatol / 3;
    tol2 = 2 * tol1;
    if (evaluations >= maxEvaluations) break;
  }
  return xf;
}
