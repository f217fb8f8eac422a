'use client';
/**
 * Keeps a failing view to itself. Without it an exception while drawing one view (tiling, perpendicular
 * space, diffraction, 3D) reaches the page's error boundary, which replaces the whole workspace and, with
 * it, the model the user was editing. Here the view shows what failed and the rest of the workspace — the
 * model panel with its unsaved edits, the other views — keeps working. A new cut or another view clears it.
 */
import { Component, type ErrorInfo, type ReactNode } from 'react';

interface Props {
  /** The view's name as on its tab, for the message. */
  name: string;
  /** When any of these change (another view, a new cut), the view is tried again. */
  resetKeys: readonly unknown[];
  children: ReactNode;
}

interface State {
  error: Error | null;
}

export class ViewBoundary extends Component<Props, State> {
  state: State = { error: null };

  static getDerivedStateFromError(error: unknown): State {
    return { error: error instanceof Error ? error : new Error(String(error)) };
  }

  componentDidCatch(error: unknown, info: ErrorInfo): void {
    // Kept in the console for a bug report; the user sees the short message below.
    console.error(`The ${this.props.name} view failed`, error, info.componentStack);
  }

  componentDidUpdate(prev: Props): void {
    if (!this.state.error) return;
    const a = prev.resetKeys, b = this.props.resetKeys;
    if (a.length !== b.length || a.some((x, i) => !Object.is(x, b[i]))) this.setState({ error: null });
  }

  render(): ReactNode {
    const { error } = this.state;
    if (!error) return this.props.children;
    return (
      <div role="alert" data-testid="view-error" className="grid h-full place-items-center p-4 text-center text-sm">
        <div className="max-w-md space-y-2">
          <p className="font-medium text-clay">The {this.props.name} view could not draw this cut.</p>
          <p className="text-ink-soft">Your model and its unsaved edits are kept; the other views still work. Please report this with the model’s parameters.</p>
          <p className="break-words font-mono text-xs text-ink-soft">{error.message}</p>
          <button type="button" className="rounded-md border border-tide px-3 py-1 text-tide hover:bg-tide-pale" onClick={() => this.setState({ error: null })}>
            Try again
          </button>
        </div>
      </div>
    );
  }
}
