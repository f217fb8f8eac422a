/** Shown while the workspace reads the project and its measured patterns; the panels keep their places. */
export default function WorkspaceLoading() {
  return (
    <div className="grid h-[calc(100vh-9.5rem)] min-h-[600px] animate-pulse gap-3 lg:grid-cols-[320px_1fr]" role="status" aria-label="Loading the workspace">
      <div className="rounded-lg border border-rule bg-card" />
      <div className="rounded-lg border border-rule bg-card" />
    </div>
  );
}
