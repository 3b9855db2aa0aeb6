import { Component, type ReactNode } from 'react';

export interface PanelBoundaryProps {
  /** Shown in the message ("the obstacle pass"). */
  name: string;
  children?: ReactNode;
}

/**
 * A panel that fails to load (its chunk not fetched, offline before it was ever opened) or to
 * render shows a message in its place; the rest of the app keeps working.
 */
export class PanelBoundary extends Component<PanelBoundaryProps, { error: string | null }> {
  override state = { error: null as string | null };

  static getDerivedStateFromError(e: unknown): { error: string } {
    return { error: e instanceof Error ? e.message : String(e) };
  }

  override render() {
    if (this.state.error) {
      return (
        <section className="panel">
          <p className="hint">
            The {this.props.name} panel could not be loaded ({this.state.error}). Reload the page when online.
          </p>
        </section>
      );
    }
    return this.props.children;
  }
}
