/**
 * The two fused last stages the two-layer nonlinear term (twoLayerNonlinear.ts) adds to those of
 * fusedStages.ts, written the same way: the twiddle-free last radix-4 butterfly of a BatchFFT done
 * inside the pass that follows it, with the operations of `lastStageInPlace` in the same order, so
 * the results equal the unfused ones bit for bit. Nothing here allocates.
 */

/**
 * Backward x transforms of both layers finished in place, as `lastStageProducts` does for one: each
 * u_i + i·v_i becomes (u_i·v_i, v_i² − u_i²), and the coupling product u₁v₂ − u₂v₁ = J(ψ₁, ψ₂) is
 * written to the real grid X: the value at work-grid index t (doubles) goes to X[t/2], so X holds
 * (x, y) at x·ny + y. `speeds` receives max|u₁|, max|v₁|, max|u₂|, max|v₂| from `at` on. W1 and W2
 * are work grids of the same layout; `run` is their x transform's `lastRun`. The grids' rows y are
 * the transforms' `cols` batch columns (default: the whole run as one); with c0..c1, only those.
 */
export function lastStageProductsCoupled(
  W1: Float64Array,
  W2: Float64Array,
  X: Float64Array,
  run: number,
  speeds: Float64Array,
  cols = run >> 1,
  c0 = 0,
  c1 = cols,
  at = 0,
): void {
  let mu1 = 0;
  let mv1 = 0;
  let mu2 = 0;
  let mv2 = 0;
  const whole = c0 === 0 && c1 === cols;
  const first = whole ? 0 : 2 * c0;
  const seg = whole ? run : 2 * (c1 - c0);
  const step = whole ? run : 2 * cols;
  for (let o = first; o < run; o += step)
    for (let t = o, end = o + seg; t < end; t += 2) {
      const i1 = t + run;
      const i2 = i1 + run;
      const i3 = i2 + run;
      // Layer 1 (the butterfly of lastStageProducts).
      const ar = W1[t],
        ai = W1[t + 1];
      const br = W1[i1],
        bi = W1[i1 + 1];
      const cr = W1[i2],
        ci = W1[i2 + 1];
      const dr = W1[i3],
        di = W1[i3 + 1];
      const t0r = ar + cr,
        t0i = ai + ci;
      const t1r = ar - cr,
        t1i = ai - ci;
      const t2r = br + dr,
        t2i = bi + di;
      const ur = br - dr,
        ui = bi - di;
      const u0 = t0r + t2r,
        v0 = t0i + t2i;
      const u2 = t0r - t2r,
        v2 = t0i - t2i;
      const u1 = t1r - ui,
        v1 = t1i + ur;
      const u3 = t1r + ui,
        v3 = t1i - ur;
      // Layer 2.
      const er = W2[t],
        ei = W2[t + 1];
      const fr = W2[i1],
        fi = W2[i1 + 1];
      const gr = W2[i2],
        gi = W2[i2 + 1];
      const hr = W2[i3],
        hi = W2[i3 + 1];
      const s0r = er + gr,
        s0i = ei + gi;
      const s1r = er - gr,
        s1i = ei - gi;
      const s2r = fr + hr,
        s2i = fi + hi;
      const wr = fr - hr,
        wi = fi - hi;
      const p0 = s0r + s2r,
        q0 = s0i + s2i;
      const p2 = s0r - s2r,
        q2 = s0i - s2i;
      const p1 = s1r - wi,
        q1 = s1i + wr;
      const p3 = s1r + wi,
        q3 = s1i - wr;
      W1[t] = u0 * v0;
      W1[t + 1] = v0 * v0 - u0 * u0;
      W1[i1] = u1 * v1;
      W1[i1 + 1] = v1 * v1 - u1 * u1;
      W1[i2] = u2 * v2;
      W1[i2 + 1] = v2 * v2 - u2 * u2;
      W1[i3] = u3 * v3;
      W1[i3 + 1] = v3 * v3 - u3 * u3;
      W2[t] = p0 * q0;
      W2[t + 1] = q0 * q0 - p0 * p0;
      W2[i1] = p1 * q1;
      W2[i1 + 1] = q1 * q1 - p1 * p1;
      W2[i2] = p2 * q2;
      W2[i2 + 1] = q2 * q2 - p2 * p2;
      W2[i3] = p3 * q3;
      W2[i3 + 1] = q3 * q3 - p3 * p3;
      X[t >> 1] = u0 * q0 - p0 * v0;
      X[i1 >> 1] = u1 * q1 - p1 * v1;
      X[i2 >> 1] = u2 * q2 - p2 * v2;
      X[i3 >> 1] = u3 * q3 - p3 * v3;
      mu1 = Math.max(mu1, Math.abs(u0), Math.abs(u1), Math.abs(u2), Math.abs(u3));
      mv1 = Math.max(mv1, Math.abs(v0), Math.abs(v1), Math.abs(v2), Math.abs(v3));
      mu2 = Math.max(mu2, Math.abs(p0), Math.abs(p1), Math.abs(p2), Math.abs(p3));
      mv2 = Math.max(mv2, Math.abs(q0), Math.abs(q1), Math.abs(q2), Math.abs(q3));
    }
  speeds[at] = mu1;
  speeds[at + 1] = mv1;
  speeds[at + 2] = mu2;
  speeds[at + 3] = mv2;
}

/**
 * Forward y transform of the coupling product's single-field block (ny rows of Kx + 1 complex
 * columns, X's half-line spectra in x), finished into both layers' tendencies: on the kept rows and
 * columns 0..Kx (ix0..ix1 − 1 when given),
 *   out1 += c1·X̂,  out2 += c2·X̂   (X̂ unnormalised: fold 1/(nx·ny) into c1 and c2).
 * `src` is the block y-transformed but for the last stage, as for `lastStageToTendency`; a block
 * cut into column slabs (realTransform2D.ts) is read as slab `origin`..`origin + half − 1`.
 */
export function lastStageAddCoupling(
  src: Float64Array,
  out1: Float64Array,
  out2: Float64Array,
  grid: { ny: number; nkx: number; Kx: number; Ky: number },
  c1: number,
  c2: number,
  ix0 = 0,
  ix1 = grid.Kx + 1,
  origin = 0,
  half = grid.Kx + 1,
): void {
  const { ny, nkx, Ky } = grid;
  const cols = half;
  const s = ny >> 2;
  const run = 2 * s * cols;
  const highBottom = ny - Ky;
  for (let r = 0; r < s; r++) {
    const j0 = r,
      j1 = s + r,
      j2 = 2 * s + r,
      j3 = 3 * s + r;
    const keep0 = j0 <= Ky || j0 >= highBottom,
      keep1 = j1 <= Ky || j1 >= highBottom;
    const keep2 = j2 <= Ky || j2 >= highBottom,
      keep3 = j3 <= Ky || j3 >= highBottom;
    if (!(keep0 || keep1 || keep2 || keep3)) continue;
    const o0 = 2 * j0 * nkx,
      o1 = 2 * j1 * nkx,
      o2 = 2 * j2 * nkx,
      o3 = 2 * j3 * nkx;
    const row = 2 * r * cols;
    for (let ix = ix0; ix < ix1; ix++) {
      const ia = row + 2 * (ix - origin);
      const aar = src[ia],
        aai = src[ia + 1];
      const abr = src[ia + run],
        abi = src[ia + run + 1];
      const acr = src[ia + 2 * run],
        aci = src[ia + 2 * run + 1];
      const adr = src[ia + 3 * run],
        adi = src[ia + 3 * run + 1];
      const a0r = aar + acr,
        a0i = aai + aci;
      const a1r = aar - acr,
        a1i = aai - aci;
      const a2r = abr + adr,
        a2i = abi + adi;
      const aur = abr - adr,
        aui = abi - adi;
      const t = 2 * ix;
      // Forward sign: X1 = t1 − i·u, X3 = t1 + i·u.
      if (keep0) add(out1, out2, o0 + t, c1, c2, a0r + a2r, a0i + a2i);
      if (keep1) add(out1, out2, o1 + t, c1, c2, a1r + aui, a1i - aur);
      if (keep2) add(out1, out2, o2 + t, c1, c2, a0r - a2r, a0i - a2i);
      if (keep3) add(out1, out2, o3 + t, c1, c2, a1r - aui, a1i + aur);
    }
  }
}

function add(out1: Float64Array, out2: Float64Array, at: number, c1: number, c2: number, xr: number, xi: number): void {
  out1[at] += c1 * xr;
  out1[at + 1] += c1 * xi;
  out2[at] += c2 * xr;
  out2[at + 1] += c2 * xi;
}
