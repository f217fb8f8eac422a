import Link from 'next/link';
import { buttonClass } from '@/components/ui/buttons';

const steps = [
  { title: 'Cut', text: 'Pick a hyperspace model and an order p/q, or a finite patch, and cut a set of points from it.' },
  { title: 'Decorate', text: 'Put atoms on site classes and cluster shells; merge what lands too close.' },
  { title: 'Check', text: 'Composition, density, shortest distances and symmetry, before any simulation time is spent.' },
  { title: 'Diffract', text: 'Simulate powder and zone-axis patterns and set them against what your colleagues measured.' },
  { title: 'Keep and share', text: 'Every saved parameter set is an immutable revision; fork a colleague’s model to try your own idea.' },
  { title: 'Export', text: 'XYZ, extended XYZ and CIF with the parameters and engine version that made them.' },
];

export default function Home() {
  return (
    <div className="space-y-10">
      <section className="grid gap-8 md:grid-cols-[3fr_2fr] md:items-center">
        <div className="space-y-4">
          <h1 className="text-4xl font-semibold tracking-tight">Tauforge</h1>
          <p className="max-w-xl text-lg leading-relaxed text-ink-soft">
            Tauforge turns cut-and-project models of quasicrystals into periodic approximants and finite patches that
            DFT and molecular-dynamics codes can run. It checks each model, simulates its diffraction for comparison
            with measured patterns, and keeps every parameter set reproducible and shareable within your team.
          </p>
          <div className="flex gap-3">
            <Link href="/projects" className={buttonClass}>
              Open your projects
            </Link>
            <Link href="/explore" className="rounded-md border border-rule bg-card px-4 py-2 font-medium hover:border-tide">
              Browse public models
            </Link>
          </div>
        </div>
        <ChainFigure />
      </section>
      <section aria-labelledby="steps" className="space-y-3">
        <h2 id="steps" className="text-sm font-semibold uppercase tracking-wider text-ink-soft">A day with a model</h2>
        <ol className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {steps.map((s, i) => (
            <li key={s.title} className="rounded-lg border border-rule bg-card p-4">
              <div className="flex items-baseline gap-2">
                <span className="font-mono text-sm text-brass">{String(i + 1).padStart(2, '0')}</span>
                <h3 className="font-semibold">{s.title}</h3>
              </div>
              <p className="mt-1 text-sm leading-relaxed text-ink-soft">{s.text}</p>
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}

/** A strip of the Fibonacci chain (long and short segments), drawn from the cut-and-project rule. */
function ChainFigure() {
  const tau = (1 + Math.sqrt(5)) / 2;
  // Segment n is long when floor((n+1)/τ) − floor(n/τ) = 1 (the Sturmian form of the Fibonacci word).
  const segs: { x: number; long: boolean }[] = [];
  let x = 0;
  for (let n = 1; n <= 21; n++) {
    const long = Math.floor((n + 1) / tau) - Math.floor(n / tau) === 1;
    segs.push({ x, long });
    x += long ? tau : 1;
  }
  const k = 300 / x;
  return (
    <figure className="rounded-lg border border-rule bg-card p-4">
      <svg viewBox="0 0 310 60" className="w-full" role="img" aria-label="A Fibonacci chain of long and short segments">
        {segs.map((s, i) => (
          <rect
            key={i}
            x={5 + s.x * k}
            y={s.long ? 14 : 22}
            width={(s.long ? tau : 1) * k - 2}
            height={s.long ? 32 : 16}
            rx={2}
            fill={s.long ? 'var(--color-tide)' : 'var(--color-brass)'}
          />
        ))}
      </svg>
      <figcaption className="mt-2 text-xs text-ink-soft">
        Long and short segments of a Fibonacci chain; their counts approach τ ≈ 1.618.
      </figcaption>
    </figure>
  );
}
