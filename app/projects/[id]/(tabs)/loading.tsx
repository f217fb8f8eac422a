/** Shown under the project header while a tab's page loads its data. */
export default function TabLoading() {
  return (
    <div className="animate-pulse space-y-3" role="status" aria-label="Loading">
      <div className="h-4 w-1/3 rounded bg-rule" />
      <div className="h-32 rounded-lg border border-rule bg-card" />
    </div>
  );
}
