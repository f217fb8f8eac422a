import type { Metadata } from 'next';
import { ProjectTable } from '@/components/projects/ProjectTable';

export const metadata: Metadata = { title: 'Public models' };

export default function ExplorePage() {
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-semibold tracking-tight">Public models</h1>
      <p className="max-w-2xl text-ink-soft">Models their owners chose to share with everyone. Open one to read its history, download its exports, or fork it to try your own idea.</p>
      <ProjectTable scope="public" />
    </div>
  );
}
