/**
 * The Tauforge mark: a thick and a thin rhombus of a rhombus tiling sharing one edge, the two tiles
 * whose counts approach the golden ratio.
 */
export function Mark({ size = 28, className }: { size?: number; className?: string }) {
  // Unit edge; thick rhombus has a 72° corner at the origin, the thin one a 36° corner.
  const c72 = Math.cos((72 * Math.PI) / 180);
  const s72 = Math.sin((72 * Math.PI) / 180);
  const c36 = Math.cos((36 * Math.PI) / 180);
  const s36 = Math.sin((36 * Math.PI) / 180);
  const k = 16;
  const ox = 4;
  const oy = 30;
  const p = (x: number, y: number) => `${(ox + k * x).toFixed(2)},${(oy - k * y).toFixed(2)}`;
  const thick = [p(0, 0), p(1, 0), p(1 + c72, s72), p(c72, s72)].join(' ');
  // The thin rhombus shares the edge from (1,0) to (1+c72, s72), opening to the right.
  const ax = 1;
  const ay = 0;
  const ex = c72;
  const ey = s72;
  // Rotate the shared edge direction by -36° to get the thin rhombus' second edge.
  const fx = ex * c36 + ey * s36;
  const fy = -ex * s36 + ey * c36;
  const thin = [p(ax, ay), p(ax + fx, ay + fy), p(ax + fx + ex, ay + fy + ey), p(ax + ex, ay + ey)].join(' ');
  return (
    <svg width={size} height={size} viewBox="0 0 44 34" className={className} role="img" aria-label="Tauforge">
      <polygon points={thick} fill="var(--color-tide)" stroke="var(--color-ink)" strokeWidth="1.2" strokeLinejoin="round" />
      <polygon points={thin} fill="var(--color-brass)" stroke="var(--color-ink)" strokeWidth="1.2" strokeLinejoin="round" />
    </svg>
  );
}
