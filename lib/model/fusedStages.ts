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
 * Where each kx column of a block cut into column slabs lives (realTransform2D.ts): column k of
 * row y at offset[k] + y·stride[k] for field a, bOffset[k] further for field b. Tables over every
 * k < nx (columns a block does not hold are never looked up).
 */
export interface ColumnSlabLayout {
  readonly offset: Int32Array;
  readonly stride: Int32Array;
  readonly bOffset: Int32Array;
}

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
  rowOffset: Int32Array,
  rowStride: Int32Array,
  rowCuts: Int32Array,
  nx: number,
  ny: number,
  top: number,
  kx0 = 0,
  kx1 = top + 1,
  origin = 0,
  half = top + 1,
): void {
  const cols = 2 * half;
  const s = ny >> 2;
  const run = 2 * s * cols;
  const bOff = 2 * half;
  const nyq = nx >> 1;
  // kx outer, r inner: the eight output streams of a column are written in order. Output row
  // y = r + j·s of column x is at rowOffset[y] + x·rowStride[y] (one slab: 2y + 2x·ny).
  for (let kx = kx0; kx < kx1; kx++) {
    const mirror = kx > 0 && kx < nyq;
    const xd = nx - kx;
    // Runs of r over which none of the four output rows r + j·s crosses into another slab, so
    // each stream advances by 2 a row (rowCuts, realTransform2D.ts; one run for one slab).
    for (let run0 = 0; run0 + 1 < rowCuts.length; run0++) {
      const ra = rowCuts[run0];
      const rb = rowCuts[run0 + 1];
      const f0 = rowOffset[ra] - 2 * ra,
        d0 = rowStride[ra];
      const f1 = rowOffset[ra + s] - 2 * ra,
        d1 = rowStride[ra + s];
      const f2 = rowOffset[ra + 2 * s] - 2 * ra,
        d2 = rowStride[ra + 2 * s];
      const f3 = rowOffset[ra + 3 * s] - 2 * ra,
        d3 = rowStride[ra + 3 * s];
      const u0 = f0 + kx * d0,
        u1 = f1 + kx * d1,
        u2 = f2 + kx * d2,
        u3 = f3 + kx * d3;
      const m0 = f0 + xd * d0,
        m1 = f1 + xd * d1,
        m2 = f2 + xd * d2,
        m3 = f3 + xd * d3;
      for (let r = ra; r < rb; r++) {
        const ia = 2 * (r * cols + kx - origin);
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
        const o0 = u0 + 2 * r,
          o1 = u1 + 2 * r,
          o2 = u2 + 2 * r,
          o3 = u3 + 2 * r;
        W[o0] = A0r - B0i;
        W[o0 + 1] = A0i + B0r;
        W[o1] = A1r - B1i;
        W[o1 + 1] = A1i + B1r;
        W[o2] = A2r - B2i;
        W[o2 + 1] = A2i + B2r;
        W[o3] = A3r - B3i;
        W[o3 + 1] = A3i + B3r;
        if (mirror) {
          const n0 = m0 + 2 * r,
            n1 = m1 + 2 * r,
            n2 = m2 + 2 * r,
            n3 = m3 + 2 * r;
          W[n0] = A0r + B0i;
          W[n0 + 1] = B0r - A0i;
          W[n1] = A1r + B1i;
          W[n1 + 1] = B1r - A1i;
          W[n2] = A2r + B2i;
          W[n2 + 1] = B2r - A2i;
          W[n3] = A3r + B3i;
          W[n3 + 1] = B3r - A3i;
        }
      }
    }
  }
  // The zero columns top + 1 .. nx − top − 1, shared out in proportion to kx0..kx1 of 0..top.
  const zeros = nx - 2 * top - 1;
  if (zeros > 0) {
    const z0 = top + 1 + Math.floor((zeros * kx0) / (top + 1));
    const z1 = top + 1 + Math.floor((zeros * kx1) / (top + 1));
    // Every slab's rows of those columns: slab by slab, the first row of each names it.
    if (z1 > z0)
      for (let y = 0; y < ny; y += rowStride[y] >> 1)
        W.fill(0, rowOffset[y] + z0 * rowStride[y], rowOffset[y] + z1 * rowStride[y]);
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
  srcRows = ny,
  srcY0 = 0,
  layout: ColumnSlabLayout | null = null,
): void {
  const cols = 2 * (top + 1);
  const bOff = 2 * (top + 1);
  const s = nx >> 2;
  const run = 2 * s * srcRows;
  // Where column k of row y goes: at[k] + y·rowLen[k] for field a, + bAt[k] more for field b.
  const at = layout ? layout.offset : null;
  const rowLen = layout ? layout.stride : null;
  const bAt = layout ? layout.bOffset : null;
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
    const ir = 2 * r * srcRows - 2 * srcY0;
    const ip = 2 * rp * srcRows - 2 * srcY0;
    // Each output column's place in the block (one slab: 2k + y·2·cols, b at bOff).
    const pk0 = at ? at[k0] : 2 * k0,
      pk1 = at ? at[k1] : 2 * k1,
      pk2 = at ? at[k2] : 2 * k2,
      pk3 = at ? at[k3] : 2 * k3;
    const pq0 = at ? at[q0] : 2 * q0,
      pq1 = at ? at[q1] : 2 * q1,
      pq2 = at ? at[q2] : 2 * q2,
      pq3 = at ? at[q3] : 2 * q3;
    const lk0 = rowLen ? rowLen[k0] : 2 * cols,
      lk1 = rowLen ? rowLen[k1] : 2 * cols,
      lk2 = rowLen ? rowLen[k2] : 2 * cols,
      lk3 = rowLen ? rowLen[k3] : 2 * cols;
    const lq0 = rowLen ? rowLen[q0] : 2 * cols,
      lq1 = rowLen ? rowLen[q1] : 2 * cols,
      lq2 = rowLen ? rowLen[q2] : 2 * cols,
      lq3 = rowLen ? rowLen[q3] : 2 * cols;
    const bk0 = bAt ? bAt[k0] : bOff,
      bk1 = bAt ? bAt[k1] : bOff,
      bk2 = bAt ? bAt[k2] : bOff,
      bk3 = bAt ? bAt[k3] : bOff;
    const bq0 = bAt ? bAt[q0] : bOff,
      bq1 = bAt ? bAt[q1] : bOff,
      bq2 = bAt ? bAt[q2] : bOff,
      bq3 = bAt ? bAt[q3] : bOff;
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
      // Partner of Y_j: Z_{3−j} when r > 0; at r = 0 it is Y_{(4−j) mod 4} (Z = Y there).
      if (r === 0) {
        if (keepK0) put(block, pk0 + y * lk0, bk0, y0r, y0i, y0r, y0i);
        if (keepK1) put(block, pk1 + y * lk1, bk1, y1r, y1i, y3r, y3i);
        if (keepK2) put(block, pk2 + y * lk2, bk2, y2r, y2i, y2r, y2i);
        if (keepK3) put(block, pk3 + y * lk3, bk3, y3r, y3i, y1r, y1i);
        continue;
      }
      if (keepK0) put(block, pk0 + y * lk0, bk0, y0r, y0i, z3r, z3i);
      if (keepK1) put(block, pk1 + y * lk1, bk1, y1r, y1i, z2r, z2i);
      if (keepK2) put(block, pk2 + y * lk2, bk2, y2r, y2i, z1r, z1i);
      if (keepK3) put(block, pk3 + y * lk3, bk3, y3r, y3i, z0r, z0i);
      if (keepQ0) put(block, pq0 + y * lq0, bq0, z0r, z0i, y3r, y3i);
      if (keepQ1) put(block, pq1 + y * lq1, bq1, z1r, z1i, y2r, y2i);
      if (keepQ2) put(block, pq2 + y * lq2, bq2, z2r, z2i, y1r, y1i);
      if (keepQ3) put(block, pq3 + y * lq3, bq3, z3r, z3i, y0r, y0i);
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
  origin = 0,
  half = grid.Kx + 1,
  outAt = 0,
  outStride = grid.nkx,
): void {
  const { ny, Ky, kx, ky } = grid;
  const cols = 2 * half;
  const bOff = 2 * half;
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
    const o0 = outAt + 2 * j0 * outStride,
      o1 = outAt + 2 * j1 * outStride,
      o2 = outAt + 2 * j2 * outStride,
      o3 = outAt + 2 * j3 * outStride;
    const row = 2 * r * cols;
    for (let ix = ix0; ix < ix1; ix++) {
      const ia = row + 2 * (ix - origin);
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
  origin = 0,
  half = grid.Kx + 1,
  qAt = 0,
  qStride = grid.nkx,
): void {
  const { ny, nkx, Ky, kx, ky } = grid;
  const cols = 2 * half;
  const row = 2 * cols; // doubles per block row
  const bOff = 2 * half;
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
    // Where row y_j of q̂ starts (q̂ may be kept in slabs: modeSlabs.ts).
    const r0 = qAt + 2 * y0 * qStride,
      r1 = qAt + 2 * y1 * qStride,
      r2 = qAt + 2 * y2 * qStride,
      r3 = qAt + 2 * y3 * qStride;
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
        const pr = -qHat[r0 + 2 * ix] * invK2[m];
        const pi = -qHat[r0 + 2 * ix + 1] * invK2[m];
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
        const pr = -qHat[r1 + 2 * ix] * invK2[m];
        const pi = -qHat[r1 + 2 * ix + 1] * invK2[m];
        a1r = ky1 * pi;
        a1i = -ky1 * pr;
        b1r = -kxv * pi;
        b1i = kxv * pr;
      }
      const t = o0 + 2 * (ix - origin);
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
        const pr = -qHat[r2 + 2 * ix] * invK2[m];
        const pi = -qHat[r2 + 2 * ix + 1] * invK2[m];
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
        const pr = -qHat[r3 + 2 * ix] * invK2[m];
        const pi = -qHat[r3 + 2 * ix + 1] * invK2[m];
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
