/**
 * Convex polygon windows in a 2D perpendicular space, with a half-open boundary rule.
 *
 * Rule: a point on an edge is inside iff that edge's outward normal is lexicographically positive
 * (first nonzero component > 0); a point on a corner is inside iff both edges there say so. This is exactly
 * the limit of moving every point by an infinitesimal −ε(1, δ), 0 < δ ≪ 1 (equivalently the window by
 * +ε(1, δ)): points on "+" edges move in, points on "−" edges move out. Moving the window is a phason shift,
 * so the rule always yields the vertex set of a genuine, non-singular cut — a valid tiling even at singular
 * offsets. "On an edge" means within `tol` of it, so that rounding cannot split exact ties.
 */
export interface Polygon {
  /** Counter-clockwise corners, x y x y … */
  corners: Float64Array;
  /** Unit outward normals per edge (edge i runs from corner i to corner i+1), x y … */
  normals: Float64Array;
  /** Support value n·corner_i per edge. */
  support: Float64Array;
  /** Normal is lexicographically positive (edge belongs to the window). */
  closed: Uint8Array;
  tol: number;
  area: number;
}

/** Convex hull (Andrew's monotone chain), dropping collinear points within tol, then the edge data. */
export function convexPolygon(points: ArrayLike<number>, tolRel = 1e-9): Polygon | null {
  const n = points.length / 2;
  const idx = Array.from({ length: n }, (_, i) => i);
  let scale = 0;
  for (let i = 0; i < points.length; i++) scale = Math.max(scale, Math.abs(points[i]));
  const tol = tolRel * Math.max(scale, 1);
  idx.sort((a, b) => points[2 * a] - points[2 * b] || points[2 * a + 1] - points[2 * b + 1]);
  const cross = (o: number, a: number, b: number) =>
    (points[2 * a] - points[2 * o]) * (points[2 * b + 1] - points[2 * o + 1]) -
    (points[2 * a + 1] - points[2 * o + 1]) * (points[2 * b] - points[2 * o]);
  const build = (order: number[]) => {
    const h: number[] = [];
    for (const i of order) {
      while (h.length >= 2 && cross(h[h.length - 2], h[h.length - 1], i) <= tol * scale) h.pop();
      h.push(i);
    }
    return h;
  };
  const lower = build(idx);
  const upper = build(idx.slice().reverse());
  const hull = lower.slice(0, -1).concat(upper.slice(0, -1));
  if (hull.length < 3) return null;
  const m = hull.length;
  const corners = new Float64Array(2 * m);
  hull.forEach((i, k) => {
    corners[2 * k] = points[2 * i];
    corners[2 * k + 1] = points[2 * i + 1];
  });
  const normals = new Float64Array(2 * m);
  const support = new Float64Array(m);
  const closed = new Uint8Array(m);
  let area = 0;
  for (let k = 0; k < m; k++) {
    const x0 = corners[2 * k], y0 = corners[2 * k + 1];
    const x1 = corners[(2 * k + 2) % (2 * m)], y1 = corners[(2 * k + 3) % (2 * m)];
    area += x0 * y1 - x1 * y0;
    const len = Math.hypot(x1 - x0, y1 - y0);
    const nx = (y1 - y0) / len, ny = -(x1 - x0) / len;
    normals[2 * k] = nx;
    normals[2 * k + 1] = ny;
    support[k] = nx * x0 + ny * y0;
    closed[k] = nx > 1e-12 || (Math.abs(nx) <= 1e-12 && ny > 0) ? 1 : 0;
  }
  return { corners, normals, support, closed, tol, area: area / 2 };
}

/** Half-open membership (see the rule above). */
export function polygonContains(w: Polygon, x: number, y: number): boolean {
  const m = w.support.length;
  for (let k = 0; k < m; k++) {
    const d = w.normals[2 * k] * x + w.normals[2 * k + 1] * y - w.support[k];
    if (d > w.tol) return false;
    if (d >= -w.tol && !w.closed[k]) return false;
  }
  return true;
}
