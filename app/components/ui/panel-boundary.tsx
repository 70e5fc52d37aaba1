import { Component, type ErrorInfo, type ReactNode } from "react";

/** Keeps one failing panel from blanking the page: it shows its own message and a retry. */
export class PanelBoundary extends Component<{ title: string; children: ReactNode }, { error: Error | null }> {
  override state = { error: null as Error | null };

  static getDerivedStateFromError(error: Error) {
    return { error };
  }

  override componentDidCatch(error: Error, info: ErrorInfo) {
    console.error(`Panel "${this.props.title}" failed`, error, info.componentStack);
  }

  override render() {
    if (!this.state.error) return this.props.children;
    return (
      <section role="alert" className="rounded-md border border-out bg-card p-4 text-sm">
        <h2 className="font-semibold">{this.props.title}</h2>
        <p className="mt-1 text-ink-soft">This panel could not be drawn: {this.state.error.message}</p>
        <button type="button" className="mt-2 text-accent underline" onClick={() => this.setState({ error: null })}>Try again</button>
      </section>
    );
  }
}
