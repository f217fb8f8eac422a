import type { Metadata } from 'next';
import { Workspace } from '@/components/workspace/Workspace';
import { starterParams } from '@/components/forms/families';

export const metadata: Metadata = { title: 'Model lab' };

/** The workspace without a project or database: a scratch model that is never saved. */
export default function LabWorkspacePage() {
  return <Workspace lab initialParams={starterParams('icosahedral')} />;
}
