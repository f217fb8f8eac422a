/** Shown while a project is read for the first time (its header and tab, or its workspace). */
export default function ProjectLoading() {
  return (
    <div className="animate-pulse space-y-6" role="status" aria-label="Loading the project">
      <div className="space-y-2">
        <div className="h-3 w-40 rounded bg-rule" />
        <div className="h-8 w-72 rounded bg-rule" />
      </div>
      <div className="h-9 border-b border-rule" />
      <div className="h-48 rounded-lg border border-rule bg-card" />
    </div>
  );
}
