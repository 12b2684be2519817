/**
 * The last radix-4 stage of a BatchFFT (len = 4, twiddle-free: inputs at t + j·run, j = 0..3) done
 * inside the pass that has to follow it anyway, so the stage's output never makes a trip through
 * memory of its own. Each function repeats the butterfly of `lastStageInPlace` (batchFFT.ts) with the
 * same operations in the same order, so the results equal the unfused ones bit for bit; the sign is
 * fixed by the direction each one serves (backward +1: X1 = t1 + i·u, forward −1: X1 = t1 − i·u,
 * where t1 = a − c and u = b − d). Nothing here allocates. The loads and butterflies are written
 * out rather than called: a helper handing back several doubles would need an array or boxed
 * numbers inside the hot loop (a helper of that kind measured 3× slower).
 * Derivation, index maps and the stage-by-stage map to the plain passes: docs/fused-step.md.
 *
 * Each function takes an optional range (of kx columns or of grid rows y, default all) so that
 * threads can share a pass (threadTeam.ts, docs/threads.md): every output value is computed by
 * the same operations whatever the ranges, so any partition gives the same bits; the ranges of a
 * pass must only tile it.
 */

/**
 * Backward y transform, finished into the x-major work grid of realTransform2D.ts. `src` holds the
 * block of two half-plane spectra a (columns 0..top) and b (top+1..2·top+1), y-transformed but for
 * the last stage. Writes Z = A + iB at (kx, y) and, for 0 < kx < nx/2, Z(−kx) = conj(A) + i·conj(B)
 * at (nx − kx, y); the columns between top and nx − top are set to zero. With a range kx0..kx1 of
 * kx, only those columns, and the same share of the zero columns.
 */
export function lastStageToWorkGrid(
  src: Float64Array,
  W: Float64Array,
  nx: number,
  ny: number,
  top: number,
  kx0 = 0,
  kx1 = top + 1,
): void {
  const cols = 2 * (top + 1);
  const s = ny >> 2;
  const run = 2 * s * cols;
  const bOff = 2 * (top + 1);
  const nyq = nx >> 1;
  const s2 = 2 * s; // doubles from output row y to y + s on the work grid
  // kx outer, r inner: the eight output streams of a column are written in order.
  for (let kx = kx0; kx < kx1; kx++) {
    const up = 2 * kx * ny;
    const mirror = kx > 0 && kx < nyq;
    const down = 2 * (nx - kx) * ny;
    for (let r = 0; r < s; r++) {
      const ia = 2 * (r * cols + kx);
      const ib = ia + bOff;
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
      const A0r = a0r + a2r,
        A0i = a0i + a2i;
      const A2r = a0r - a2r,
        A2i = a0i - a2i;
      const A1r = a1r - aui,
        A1i = a1i + aur;
      const A3r = a1r + aui,
        A3i = a1i - aur;
      const bar = src[ib],
        bai = src[ib + 1];
      const bbr = src[ib + run],
        bbi = src[ib + run + 1];
      const bcr = src[ib + 2 * run],
        bci = src[ib + 2 * run + 1];
      const bdr = src[ib + 3 * run],
        bdi = src[ib + 3 * run + 1];
      const b0r = bar + bcr,
        b0i = bai + bci;
      const b1r = bar - bcr,
        b1i = bai - bci;
      const b2r = bbr + bdr,
        b2i = bbi + bdi;
      const bur = bbr - bdr,
        bui = bbi - bdi;
      const B0r = b0r + b2r,
        B0i = b0i + b2i;
      const B2r = b0r - b2r,
        B2i = b0i - b2i;
      const B1r = b1r - bui,
        B1i = b1i + bur;
      const B3r = b1r + bui,
        B3i = b1i - bur;
      const o = up + 2 * r;
      W[o] = A0r - B0i;
      W[o + 1] = A0i + B0r;
      W[o + s2] = A1r - B1i;
      W[o + s2 + 1] = A1i + B1r;
      W[o + 2 * s2] = A2r - B2i;
      W[o + 2 * s2 + 1] = A2i + B2r;
      W[o + 3 * s2] = A3r - B3i;
      W[o + 3 * s2 + 1] = A3i + B3r;
      if (mirror) {
        const m = down + 2 * r;
        W[m] = A0r + B0i;
        W[m + 1] = B0r - A0i;
        W[m + s2] = A1r + B1i;
        W[m + s2 + 1] = B1r - A1i;
        W[m + 2 * s2] = A2r + B2i;
        W[m + 2 * s2 + 1] = B2r - A2i;
        W[m + 3 * s2] = A3r + B3i;
        W[m + 3 * s2 + 1] = B3r - A3i;
      }
    }
  }
  // The zero columns top + 1 .. nx − top − 1, shared out in proportion to kx0..kx1 of 0..top.
  const zeros = nx - 2 * top - 1;
  if (zeros > 0) {
    const z0 = top + 1 + Math.floor((zeros * kx0) / (top + 1));
    const z1 = top + 1 + Math.floor((zeros * kx1) / (top + 1));
    if (z1 > z0) W.fill(0, 2 * z0 * ny, 2 * z1 * ny);
  }
}

/**
 * Backward x transform finished in place, each result u + iv replaced by the products
 * (u·v, v² − u²) of the nonlinear term (nonlinearTerm.ts). `speeds` receives max|u| and max|v| at
 * `at`, `at` + 1. The transform's batch columns are the `cols` grid rows y (default: the whole run
 * as one); with c0..c1, only those rows.
 */
export function lastStageProducts(
  data: Float64Array,
  run: number,
  speeds: Float64Array,
  cols = run >> 1,
  c0 = 0,
  c1 = cols,
  at = 0,
): void {
  let mu = 0;
  let mv = 0;
  const whole = c0 === 0 && c1 === cols;
  const first = whole ? 0 : 2 * c0;
  const seg = whole ? run : 2 * (c1 - c0);
  const step = whole ? run : 2 * cols;
  for (let o = first; o < run; o += step)
    for (let t = o, end = o + seg; t < end; t += 2) {
      const i1 = t + run;
      const i2 = i1 + run;
      const i3 = i2 + run;
      const ar = data[t],
        ai = data[t + 1];
      const br = data[i1],
        bi = data[i1 + 1];
      const cr = data[i2],
        ci = data[i2 + 1];
      const dr = data[i3],
        di = data[i3 + 1];
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
      data[t] = u0 * v0;
      data[t + 1] = v0 * v0 - u0 * u0;
      data[i1] = u1 * v1;
      data[i1 + 1] = v1 * v1 - u1 * u1;
      data[i2] = u2 * v2;
      data[i2 + 1] = v2 * v2 - u2 * u2;
      data[i3] = u3 * v3;
      data[i3 + 1] = v3 * v3 - u3 * u3;
      // Math.max/abs compile to branch-free instructions; a compare-and-branch here costs ~6% of a step.
      mu = Math.max(mu, Math.abs(u0), Math.abs(u1), Math.abs(u2), Math.abs(u3));
      mv = Math.max(mv, Math.abs(v0), Math.abs(v1), Math.abs(v2), Math.abs(v3));
    }
  speeds[at] = mu;
  speeds[at + 1] = mv;
}

/**
 * Forward x transform of the x-major work grid (a + i·b), finished into the block of realTransform2D.ts:
 * for each kept k ≤ top, the half-line spectra A(k) = ½(Y(k) + conj Y(−k)) and B(k) = (Y(k) − conj Y(−k))/2i
 * at row y. Y(k) and Y(nx − k) come from the butterflies at r and s − r (s = nx/4), so those two
 * are done together. With y0..y1, only those rows.
 */
export function lastStageToBlock(
  src: Float64Array,
  block: Float64Array,
  nx: number,
  ny: number,
  top: number,
  y0 = 0,
  y1 = ny,
): void {
  const cols = 2 * (top + 1);
  const bOff = 2 * (top + 1);
  const s = nx >> 2;
  const run = 2 * s * ny;
  for (let r = 0; r <= s >> 1; r++) {
    const rp = (s - r) % s; // the partner residue: nx − (j·s + r) = (3 − j)·s + (s − r)
    const pair = rp !== r;
    // Frequencies of the outputs X_j at r and at rp, and whether the block keeps them.
    const k0 = r,
      k1 = s + r,
      k2 = 2 * s + r,
      k3 = 3 * s + r;
    const q0 = rp,
      q1 = s + rp,
      q2 = 2 * s + rp,
      q3 = 3 * s + rp;
    const keepK0 = k0 <= top,
      keepK1 = k1 <= top,
      keepK2 = k2 <= top,
      keepK3 = k3 <= top;
    const keepQ0 = pair && q0 <= top,
      keepQ1 = pair && q1 <= top,
      keepQ2 = pair && q2 <= top,
      keepQ3 = pair && q3 <= top;
    const ir = 2 * r * ny;
    const ip = 2 * rp * ny;
    for (let y = y0; y < y1; y++) {
      const ia = ir + 2 * y;
      const ar = src[ia],
        ai = src[ia + 1];
      const br = src[ia + run],
        bi = src[ia + run + 1];
      const cr = src[ia + 2 * run],
        ci = src[ia + 2 * run + 1];
      const dr = src[ia + 3 * run],
        di = src[ia + 3 * run + 1];
      const t0r = ar + cr,
        t0i = ai + ci;
      const t1r = ar - cr,
        t1i = ai - ci;
      const t2r = br + dr,
        t2i = bi + di;
      const ur = br - dr,
        ui = bi - di;
      // Y_j = Y(j·s + r); forward sign: X1 = t1 − i·u, X3 = t1 + i·u.
      const y0r = t0r + t2r,
        y0i = t0i + t2i;
      const y2r = t0r - t2r,
        y2i = t0i - t2i;
      const y1r = t1r + ui,
        y1i = t1i - ur;
      const y3r = t1r - ui,
        y3i = t1i + ur;
      let z0r = y0r,
        z0i = y0i,
        z1r = y1r,
        z1i = y1i,
        z2r = y2r,
        z2i = y2i,
        z3r = y3r,
        z3i = y3i;
      if (pair) {
        const ib = ip + 2 * y;
        const er = src[ib],
          ei = src[ib + 1];
        const fr = src[ib + run],
          fi = src[ib + run + 1];
        const gr = src[ib + 2 * run],
          gi = src[ib + 2 * run + 1];
        const hr = src[ib + 3 * run],
          hi = src[ib + 3 * run + 1];
        const s0r = er + gr,
          s0i = ei + gi;
        const s1r = er - gr,
          s1i = ei - gi;
        const s2r = fr + hr,
          s2i = fi + hi;
        const vr = fr - hr,
          vi = fi - hi;
        z0r = s0r + s2r;
        z0i = s0i + s2i;
        z2r = s0r - s2r;
        z2i = s0i - s2i;
        z1r = s1r + vi;
        z1i = s1i - vr;
        z3r = s1r - vi;
        z3i = s1i + vr;
      }
      const d = 2 * y * cols;
      // Partner of Y_j: Z_{3−j} when r > 0; at r = 0 it is Y_{(4−j) mod 4} (Z = Y there).
      if (r === 0) {
        if (keepK0) put(block, d + 2 * k0, bOff, y0r, y0i, y0r, y0i);
        if (keepK1) put(block, d + 2 * k1, bOff, y1r, y1i, y3r, y3i);
        if (keepK2) put(block, d + 2 * k2, bOff, y2r, y2i, y2r, y2i);
        if (keepK3) put(block, d + 2 * k3, bOff, y3r, y3i, y1r, y1i);
        continue;
      }
      if (keepK0) put(block, d + 2 * k0, bOff, y0r, y0i, z3r, z3i);
      if (keepK1) put(block, d + 2 * k1, bOff, y1r, y1i, z2r, z2i);
      if (keepK2) put(block, d + 2 * k2, bOff, y2r, y2i, z1r, z1i);
      if (keepK3) put(block, d + 2 * k3, bOff, y3r, y3i, z0r, z0i);
      if (keepQ0) put(block, d + 2 * q0, bOff, z0r, z0i, y3r, y3i);
      if (keepQ1) put(block, d + 2 * q1, bOff, z1r, z1i, y2r, y2i);
      if (keepQ2) put(block, d + 2 * q2, bOff, z2r, z2i, y1r, y1i);
      if (keepQ3) put(block, d + 2 * q3, bOff, z3r, z3i, y0r, y0i);
    }
  }
}

/** A(k) = ½(Y + conj P) at `at`, B(k) = (Y − conj P)/2i at at + bOff, P = Y(−k). */
function put(block: Float64Array, at: number, bOff: number, yr: number, yi: number, pr: number, pi: number): void {
  block[at] = 0.5 * (yr + pr);
  block[at + 1] = 0.5 * (yi - pi);
  block[at + bOff] = 0.5 * (yi + pi);
  block[at + bOff + 1] = -0.5 * (yr - pr);
}

/**
 * Forward y transform of the products' block, finished into the nonlinear term (nonlinearTerm.ts):
 *   out(kx, ky) = (kx² − ky²)·scale·(uv)^ + kx·ky·scale·(v² − u²)^
 * on the kept rows (ky index ≤ Ky or ≥ ny − Ky) and columns 0..Kx (ix0..ix1 − 1 when given);
 * nothing else of `out` is written. `src` holds the block (columns 0..Kx of uv, then of v² − u²)
 * y-transformed but for the last stage.
 */
export function lastStageToTendency(
  src: Float64Array,
  out: Float64Array,
  grid: { ny: number; nkx: number; Kx: number; Ky: number; kx: Float64Array; ky: Float64Array },
  scale: number,
  ix0 = 0,
  ix1 = grid.Kx + 1,
): void {
  const { ny, nkx, Kx, Ky, kx, ky } = grid;
  const cols = 2 * (Kx + 1);
  const bOff = 2 * (Kx + 1);
  const s = ny >> 2;
  const run = 2 * s * cols;
  const lowTop = Ky;
  const highBottom = ny - Ky;
  for (let r = 0; r < s; r++) {
    const j0 = r,
      j1 = s + r,
      j2 = 2 * s + r,
      j3 = 3 * s + r;
    const keep0 = j0 <= lowTop || j0 >= highBottom,
      keep1 = j1 <= lowTop || j1 >= highBottom;
    const keep2 = j2 <= lowTop || j2 >= highBottom,
      keep3 = j3 <= lowTop || j3 >= highBottom;
    if (!(keep0 || keep1 || keep2 || keep3)) continue;
    const ky0 = ky[j0],
      ky1 = ky[j1],
      ky2 = ky[j2],
      ky3 = ky[j3];
    const o0 = 2 * j0 * nkx,
      o1 = 2 * j1 * nkx,
      o2 = 2 * j2 * nkx,
      o3 = 2 * j3 * nkx;
    const row = 2 * r * cols;
    for (let ix = ix0; ix < ix1; ix++) {
      const ia = row + 2 * ix;
      const ib = ia + bOff;
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
      const bar = src[ib],
        bai = src[ib + 1];
      const bbr = src[ib + run],
        bbi = src[ib + run + 1];
      const bcr = src[ib + 2 * run],
        bci = src[ib + 2 * run + 1];
      const bdr = src[ib + 3 * run],
        bdi = src[ib + 3 * run + 1];
      const b0r = bar + bcr,
        b0i = bai + bci;
      const b1r = bar - bcr,
        b1i = bai - bci;
      const b2r = bbr + bdr,
        b2i = bbi + bdi;
      const bur = bbr - bdr,
        bui = bbi - bdi;
      const kxv = kx[ix];
      const t = 2 * ix;
      // Forward sign: X1 = t1 − i·u, X3 = t1 + i·u.
      if (keep0) tend(out, o0 + t, kxv, ky0, scale, a0r + a2r, a0i + a2i, b0r + b2r, b0i + b2i);
      if (keep1) tend(out, o1 + t, kxv, ky1, scale, a1r + aui, a1i - aur, b1r + bui, b1i - bur);
      if (keep2) tend(out, o2 + t, kxv, ky2, scale, a0r - a2r, a0i - a2i, b0r - b2r, b0i - b2i);
      if (keep3) tend(out, o3 + t, kxv, ky3, scale, a1r - aui, a1i + aur, b1r - bui, b1i + bur);
    }
  }
}

function tend(
  out: Float64Array,
  at: number,
  kxv: number,
  kyv: number,
  scale: number,
  pr: number,
  pi: number,
  qr: number,
  qi: number,
): void {
  const a = (kxv * kxv - kyv * kyv) * scale;
  const b = kxv * kyv * scale;
  out[at] = a * pr + b * qr;
  out[at + 1] = a * pi + b * qi;
}

/**
 * The velocities of the nonlinear term formed inside the first stage of the backward y transform:
 * ψ̂ = −q̂/K², û = −i·ky·ψ̂ (columns 0..Kx of the block), v̂ = i·kx·ψ̂ (columns Kx+1..2Kx+1), read
 * from q̂ on the kept rows (zero elsewhere, and at the mean) and combined at once by the stage's
 * butterflies, radix 4 over rows p + j·ny/4 or, when log2 ny is odd, radix 2 over p and p + ny/2,
 * with the twiddles of BatchFFT (cos, sin of 2π·m/ny), backward sign. Every entry of `dst` (block
 * layout) is written, or with ix0..ix1 every entry of those columns of both fields. Same operations
 * as packing the block and running the stage.
 */
export function velocitiesFirstStageY(
  qHat: Float64Array,
  invK2: Float64Array,
  grid: { ny: number; nkx: number; Kx: number; Ky: number; kx: Float64Array; ky: Float64Array },
  firstRadix: 2 | 4,
  cosT: Float64Array,
  sinT: Float64Array,
  dst: Float64Array,
  ix0 = 0,
  ix1 = grid.Kx + 1,
): void {
  const { ny, nkx, Kx, Ky, kx, ky } = grid;
  const cols = 2 * (Kx + 1);
  const row = 2 * cols; // doubles per block row
  const bOff = 2 * (Kx + 1);
  const radix = firstRadix;
  const q = ny / radix; // rows between the inputs of a butterfly
  for (let p = 0; p < q; p++) {
    // Input rows y_j = p + j·q (j < radix), whether each is kept, and its ky.
    const y0 = p,
      y1 = p + q,
      y2 = p + 2 * q,
      y3 = p + 3 * q;
    const keep0 = y0 <= Ky || y0 >= ny - Ky;
    const keep1 = y1 <= Ky || y1 >= ny - Ky;
    const keep2 = radix === 4 && (y2 <= Ky || y2 >= ny - Ky);
    const keep3 = radix === 4 && (y3 <= Ky || y3 >= ny - Ky);
    const ky0 = ky[y0],
      ky1 = ky[y1],
      ky2 = radix === 4 ? ky[y2] : 0,
      ky3 = radix === 4 ? ky[y3] : 0;
    const m0 = y0 * nkx,
      m1 = y1 * nkx,
      m2 = y2 * nkx,
      m3 = y3 * nkx;
    // Twiddles, backward sign: radix 4 X1, X2, X3 by w^p, w^2p, w^3p (none at p = 0, as BatchFFT);
    // radix 2 X1 by w^p (always multiplied, as BatchFFT).
    const c1 = cosT[p],
      s1 = sinT[p];
    const c2 = radix === 4 ? cosT[2 * p] : 1,
      s2 = radix === 4 ? sinT[2 * p] : 0;
    const c3 = radix === 4 ? cosT[3 * p] : 1,
      s3 = radix === 4 ? sinT[3 * p] : 0;
    const twiddled = radix === 2 || p > 0;
    const o0 = radix * p * row; // output rows radix·p + j
    for (let ix = ix0; ix < ix1; ix++) {
      const kxv = kx[ix];
      // û_j, v̂_j of input row j (zero when the row is not kept or at the mean).
      let a0r = 0,
        a0i = 0,
        b0r = 0,
        b0i = 0;
      if (keep0 && (ix > 0 || y0 > 0)) {
        const m = m0 + ix;
        const pr = -qHat[2 * m] * invK2[m];
        const pi = -qHat[2 * m + 1] * invK2[m];
        a0r = ky0 * pi;
        a0i = -ky0 * pr;
        b0r = -kxv * pi;
        b0i = kxv * pr;
      }
      let a1r = 0,
        a1i = 0,
        b1r = 0,
        b1i = 0;
      if (keep1) {
        const m = m1 + ix;
        const pr = -qHat[2 * m] * invK2[m];
        const pi = -qHat[2 * m + 1] * invK2[m];
        a1r = ky1 * pi;
        a1i = -ky1 * pr;
        b1r = -kxv * pi;
        b1i = kxv * pr;
      }
      const t = o0 + 2 * ix;
      if (radix === 2) {
        // X0 = a + b, X1 = (a − b)·w^p into rows 2p, 2p + 1.
        dst[t] = a0r + a1r;
        dst[t + 1] = a0i + a1i;
        dst[t + bOff] = b0r + b1r;
        dst[t + bOff + 1] = b0i + b1i;
        const xr = a0r - a1r,
          xi = a0i - a1i;
        dst[t + row] = xr * c1 - xi * s1;
        dst[t + row + 1] = xr * s1 + xi * c1;
        const zr = b0r - b1r,
          zi = b0i - b1i;
        dst[t + row + bOff] = zr * c1 - zi * s1;
        dst[t + row + bOff + 1] = zr * s1 + zi * c1;
        continue;
      }
      let a2r = 0,
        a2i = 0,
        b2r = 0,
        b2i = 0;
      if (keep2) {
        const m = m2 + ix;
        const pr = -qHat[2 * m] * invK2[m];
        const pi = -qHat[2 * m + 1] * invK2[m];
        a2r = ky2 * pi;
        a2i = -ky2 * pr;
        b2r = -kxv * pi;
        b2i = kxv * pr;
      }
      let a3r = 0,
        a3i = 0,
        b3r = 0,
        b3i = 0;
      if (keep3) {
        const m = m3 + ix;
        const pr = -qHat[2 * m] * invK2[m];
        const pi = -qHat[2 * m + 1] * invK2[m];
        a3r = ky3 * pi;
        a3i = -ky3 * pr;
        b3r = -kxv * pi;
        b3i = kxv * pr;
      }
      // Radix 4 over rows (0, 1, 2, 3) as (a, b, c, d), backward: X1 = t1 + i·u, X3 = t1 − i·u.
      {
        const o = t;
        const t0r = a0r + a2r,
          t0i = a0i + a2i;
        const t1r = a0r - a2r,
          t1i = a0i - a2i;
        const t2r = a1r + a3r,
          t2i = a1i + a3i;
        const ur = a1r - a3r,
          ui = a1i - a3i;
        dst[o] = t0r + t2r;
        dst[o + 1] = t0i + t2i;
        const x2r = t0r - t2r,
          x2i = t0i - t2i;
        const x1r = t1r - ui,
          x1i = t1i + ur;
        const x3r = t1r + ui,
          x3i = t1i - ur;
        if (twiddled) {
          dst[o + row] = x1r * c1 - x1i * s1;
          dst[o + row + 1] = x1r * s1 + x1i * c1;
          dst[o + 2 * row] = x2r * c2 - x2i * s2;
          dst[o + 2 * row + 1] = x2r * s2 + x2i * c2;
          dst[o + 3 * row] = x3r * c3 - x3i * s3;
          dst[o + 3 * row + 1] = x3r * s3 + x3i * c3;
        } else {
          dst[o + row] = x1r;
          dst[o + row + 1] = x1i;
          dst[o + 2 * row] = x2r;
          dst[o + 2 * row + 1] = x2i;
          dst[o + 3 * row] = x3r;
          dst[o + 3 * row + 1] = x3i;
        }
      }
      {
        const o = t + bOff;
        const t0r = b0r + b2r,
          t0i = b0i + b2i;
        const t1r = b0r - b2r,
          t1i = b0i - b2i;
        const t2r = b1r + b3r,
          t2i = b1i + b3i;
        const ur = b1r - b3r,
          ui = b1i - b3i;
        dst[o] = t0r + t2r;
        dst[o + 1] = t0i + t2i;
        const x2r = t0r - t2r,
          x2i = t0i - t2i;
        const x1r = t1r - ui,
          x1i = t1i + ur;
        const x3r = t1r + ui,
          x3i = t1i - ur;
        if (twiddled) {
          dst[o + row] = x1r * c1 - x1i * s1;
          dst[o + row + 1] = x1r * s1 + x1i * c1;
          dst[o + 2 * row] = x2r * c2 - x2i * s2;
          dst[o + 2 * row + 1] = x2r * s2 + x2i * c2;
          dst[o + 3 * row] = x3r * c3 - x3i * s3;
          dst[o + 3 * row + 1] = x3r * s3 + x3i * c3;
        } else {
          dst[o + row] = x1r;
          dst[o + row + 1] = x1i;
          dst[o + 2 * row] = x2r;
          dst[o + 2 * row + 1] = x2i;
          dst[o + 3 * row] = x3r;
          dst[o + 3 * row + 1] = x3i;
        }
      }
    }
  }
}
