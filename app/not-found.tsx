import Link from 'next/link';
import { buttonClass } from '@/components/ui/buttons';

export default function NotFound() {
  return (
    <div className="mx-auto max-w-md space-y-3 py-16 text-center">
      <p className="font-mono text-sm text-brass">404</p>
      <h1 className="text-2xl font-semibold">Nothing was cut here</h1>
      <p className="text-ink-soft">The page you asked for does not exist, or you may not see it.</p>
      <Link href="/" className={`inline-block ${buttonClass}`}>Back to the start</Link>
    </div>
  );
}
