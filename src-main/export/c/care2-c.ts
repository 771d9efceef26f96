// The C99 port of the engine's 2x2 CARE fast path (engine/control/care2.ts), line for line:
// matrix sign function of the 4x4 Hamiltonian by the determinant-scaled Newton iteration
// (Byers 1987, Linear Algebra Appl. 85:267-279; Kenney & Laub 1995, IEEE TAC 40(8)), X from a
// 4x2 QR by modified Gram-Schmidt, up to three Newton (Kleinman 1968) corrections through a 3x3
// Lyapunov solve, and the Routh-Hurwitz test trace < 0, det > 0 on the closed loop. Same
// constants (60 iterations, stopping rule, scaling switch) and the same order of operations,
// so that the port reproduces the engine's X to rounding. Work arrays live on the stack.

/** C source of `static int PREFIX_care2(const double a[4], const double g[3], const double q[3], double x[3])` (0 = ok). */
export function care2Source(p: string): string[] {
  return `
/* 2x2 CARE A'X + XA - XGX + Q = 0; a row-major, g, q, x upper triangles [11, 12, 22].
 * Port of the engine's care2 (engine/control/care2.ts). Returns 0 when a stabilizing X was
 * found (x written), 1 when there is none, 2 when the sign iteration did not converge. */
static double ${p}_hypot4(double a, double b, double c, double d) {
  double m = fabs(a), s;
  if (fabs(b) > m) m = fabs(b);
  if (fabs(c) > m) m = fabs(c);
  if (fabs(d) > m) m = fabs(d);
  if (m == 0.0 || m != m) return m;
  if (isinf(m)) return m;
  a /= m; b /= m; c /= m; d /= m;
  s = a * a + b * b + c * c + d * d;
  return sqrt(s) * m;
}

/* Inverse of a row-major 4x4 by Gauss-Jordan with partial pivoting; returns det (0 if singular). */
static double ${p}_inv4(const double m[16], double out[16]) {
  double aug[32];
  double det = 1.0;
  int i, j, r, col;
  for (i = 0; i < 4; i++) {
    for (j = 0; j < 4; j++) { aug[i * 8 + j] = m[i * 4 + j]; aug[i * 8 + 4 + j] = i == j ? 1.0 : 0.0; }
  }
  for (col = 0; col < 4; col++) {
    int piv = col;
    double best = fabs(aug[col * 8 + col]), pv, ip;
    for (r = col + 1; r < 4; r++) { const double v = fabs(aug[r * 8 + col]); if (v > best) { best = v; piv = r; } }
    if (best == 0.0) return 0.0;
    if (piv != col) {
      for (j = 0; j < 8; j++) { const double t = aug[col * 8 + j]; aug[col * 8 + j] = aug[piv * 8 + j]; aug[piv * 8 + j] = t; }
      det = -det;
    }
    pv = aug[col * 8 + col];
    det *= pv;
    ip = 1.0 / pv;
    for (j = 0; j < 8; j++) aug[col * 8 + j] *= ip;
    for (r = 0; r < 4; r++) {
      double f;
      if (r == col) continue;
      f = aug[r * 8 + col];
      if (f == 0.0) continue;
      for (j = 0; j < 8; j++) aug[r * 8 + j] -= f * aug[col * 8 + j];
    }
  }
  for (i = 0; i < 4; i++) for (j = 0; j < 4; j++) out[i * 4 + j] = aug[i * 8 + 4 + j];
  return det;
}

/* Relative Frobenius residual of the 2x2 CARE. */
static double ${p}_resid2(double a11, double a12, double a21, double a22, double g11, double g12, double g22,
    double q11, double q12, double q22, double x11, double x12, double x22) {
  const double p11 = a11 * x11 + a21 * x12, p12 = a11 * x12 + a21 * x22, p21 = a12 * x11 + a22 * x12, p22 = a12 * x12 + a22 * x22;
  const double gx11 = g11 * x11 + g12 * x12, gx12 = g11 * x12 + g12 * x22, gx21 = g12 * x11 + g22 * x12, gx22 = g12 * x12 + g22 * x22;
  const double w11 = x11 * gx11 + x12 * gx21, w12 = x11 * gx12 + x12 * gx22, w22 = x12 * gx12 + x22 * gx22;
  const double s11 = 2.0 * p11 - w11 + q11, s12 = p12 + p21 - w12 + q12, s22 = 2.0 * p22 - w22 + q22;
  const double r = sqrt(s11 * s11 + 2.0 * s12 * s12 + s22 * s22);
  const double nP = sqrt(p11 * p11 + p12 * p12 + p21 * p21 + p22 * p22);
  const double den = 2.0 * nP + sqrt(w11 * w11 + 2.0 * w12 * w12 + w22 * w22) + sqrt(q11 * q11 + 2.0 * q12 * q12 + q22 * q22);
  return den > 0.0 ? r / den : r;
}

static int ${p}_care2(const double a[4], const double g[3], const double q[3], double x[3]) {
  const double a11 = a[0], a12 = a[1], a21 = a[2], a22 = a[3];
  const double g11 = g[0], g12 = g[1], g22 = g[2];
  const double q11 = q[0], q12 = q[1], q22 = q[2];
  double z[16], zi[16];
  int scaling = 1, converged = 0, it, k, step;
  double prevRel = INFINITY;
  double m10, m11, m12, m13, m20, m21, m22, m23, n10, n11, n12, n13, n20, n21, n22, n23;
  double r11, r12, r22, e10, e11, e12, e13, e20, e21, e22, e23, p0, p1, p2, p3, sp;
  double c11, c12, c21, c22, y11, y12, y21, y22, x11, x12, x22, k11, k12, k21, k22, res;
  z[0] = a11; z[1] = a12; z[2] = -g11; z[3] = -g12;
  z[4] = a21; z[5] = a22; z[6] = -g12; z[7] = -g22;
  z[8] = -q11; z[9] = -q12; z[10] = -a11; z[11] = -a21;
  z[12] = -q12; z[13] = -q22; z[14] = -a12; z[15] = -a22;
  x[0] = x[1] = x[2] = NAN;
  for (it = 1; it <= 60; it++) {
    const double det = ${p}_inv4(z, zi);
    double c, hc, hic, dmax = 0.0, zmax = 0.0, rel;
    if (det == 0.0 || !isfinite(det)) return 1;
    c = scaling ? pow(fabs(det), -0.25) : 1.0;
    hc = 0.5 * c; hic = 0.5 / c;
    for (k = 0; k < 16; k++) {
      const double zn = hc * z[k] + hic * zi[k];
      const double d = fabs(zn - z[k]);
      const double az = fabs(zn);
      if (d > dmax) dmax = d;
      if (az > zmax) zmax = az;
      z[k] = zn;
    }
    rel = dmax / zmax;
    if (!(rel == rel)) break;
    if (rel < 1e-2) scaling = 0;
    if (rel <= 1e-14 || (rel < 1e-8 && rel >= 0.5 * prevRel)) { converged = 1; break; }
    prevRel = rel;
  }
  if (!converged) return 2;

  m10 = z[2]; m11 = z[6]; m12 = z[10] + 1.0; m13 = z[14];
  m20 = z[3]; m21 = z[7]; m22 = z[11]; m23 = z[15] + 1.0;
  n10 = -(z[0] + 1.0); n11 = -z[4]; n12 = -z[8]; n13 = -z[12];
  n20 = -z[1]; n21 = -(z[5] + 1.0); n22 = -z[9]; n23 = -z[13];
  r11 = ${p}_hypot4(m10, m11, m12, m13);
  if (!(r11 > 0.0)) return 1;
  e10 = m10 / r11; e11 = m11 / r11; e12 = m12 / r11; e13 = m13 / r11;
  r12 = e10 * m20 + e11 * m21 + e12 * m22 + e13 * m23;
  p0 = m20 - r12 * e10; p1 = m21 - r12 * e11; p2 = m22 - r12 * e12; p3 = m23 - r12 * e13;
  sp = e10 * p0 + e11 * p1 + e12 * p2 + e13 * p3;
  r12 += sp; p0 -= sp * e10; p1 -= sp * e11; p2 -= sp * e12; p3 -= sp * e13;
  r22 = ${p}_hypot4(p0, p1, p2, p3);
  if (!(r22 > 1e-15 * r11)) return 1;
  e20 = p0 / r22; e21 = p1 / r22; e22 = p2 / r22; e23 = p3 / r22;
  c11 = e10 * n10 + e11 * n11 + e12 * n12 + e13 * n13; c12 = e10 * n20 + e11 * n21 + e12 * n22 + e13 * n23;
  c21 = e20 * n10 + e21 * n11 + e22 * n12 + e23 * n13; c22 = e20 * n20 + e21 * n21 + e22 * n22 + e23 * n23;
  y21 = c21 / r22; y22 = c22 / r22;
  y11 = (c11 - r12 * y21) / r11; y12 = (c12 - r12 * y22) / r11;
  x11 = y11; x12 = 0.5 * (y12 + y21); x22 = y22;
  if (!(isfinite(x11) && isfinite(x12) && isfinite(x22))) return 1;

  k11 = a11 - (g11 * x11 + g12 * x12); k12 = a12 - (g11 * x12 + g12 * x22);
  k21 = a21 - (g12 * x11 + g22 * x12); k22 = a22 - (g12 * x12 + g22 * x22);
  if (!(k11 + k22 < 0.0 && k11 * k22 - k12 * k21 > 0.0)) return 1;

  res = ${p}_resid2(a11, a12, a21, a22, g11, g12, g22, q11, q12, q22, x11, x12, x22);
  for (step = 0; step < 3 && res > 0.0; step++) {
    const double gx11 = g11 * x11 + g12 * x12, gx12 = g11 * x12 + g12 * x22, gx21 = g12 * x11 + g22 * x12, gx22 = g12 * x12 + g22 * x22;
    const double s11 = 2.0 * (a11 * x11 + a21 * x12) - (x11 * gx11 + x12 * gx21) + q11;
    const double s12 = a11 * x12 + a21 * x22 + x11 * a12 + x12 * a22 - (x11 * gx12 + x12 * gx22) + q12;
    const double s22 = 2.0 * (a12 * x12 + a22 * x22) - (x12 * gx12 + x22 * gx22) + q22;
    const double t = k11 + k22;
    const double det3 = 2.0 * k11 * (t * 2.0 * k22 - k21 * 2.0 * k12) - 2.0 * k21 * (k12 * 2.0 * k22);
    double b1, b2, b3, d11, d12, d22, nx11, nx12, nx22, nres;
    if (!(det3 != 0.0 && isfinite(det3))) break;
    b1 = -s11; b2 = -s12; b3 = -s22;
    d11 = (b1 * (t * 2.0 * k22 - k21 * 2.0 * k12) - 2.0 * k21 * (b2 * 2.0 * k22 - k21 * b3)) / det3;
    d12 = (2.0 * k11 * (b2 * 2.0 * k22 - k21 * b3) - b1 * (k12 * 2.0 * k22)) / det3;
    d22 = (2.0 * k11 * (t * b3 - 2.0 * k12 * b2) - 2.0 * k21 * (k12 * b3) + b1 * (k12 * 2.0 * k12)) / det3;
    nx11 = x11 + d11; nx12 = x12 + d12; nx22 = x22 + d22;
    nres = ${p}_resid2(a11, a12, a21, a22, g11, g12, g22, q11, q12, q22, nx11, nx12, nx22);
    if (!(nres < 0.9 * res)) break;
    x11 = nx11; x12 = nx12; x22 = nx22; res = nres;
    k11 = a11 - (g11 * x11 + g12 * x12); k12 = a12 - (g11 * x12 + g12 * x22);
    k21 = a21 - (g12 * x11 + g22 * x12); k22 = a22 - (g12 * x12 + g22 * x22);
  }
  if (!(k11 + k22 < 0.0 && k11 * k22 - k12 * k21 > 0.0)) return 1;
  x[0] = x11; x[1] = x12; x[2] = x22;
  return 0;
}`.trim().split('\n');
}
