/** A narrow titled panel for the pages with one short task (sign in, sign up, reset, invitation). */
export function Card(props: { title: string; children: React.ReactNode }) {
  return (
    <div className="mx-auto max-w-md space-y-4 rounded-lg border border-rule bg-card p-6">
      <h1 className="text-2xl font-semibold tracking-tight">{props.title}</h1>
      {props.children}
    </div>
  );
}
