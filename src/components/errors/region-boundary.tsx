import { Component, type ReactNode } from 'react';
import { Problem } from './problem';

interface State {
  failed: boolean;
  error: unknown;
}

/**
 * Keeps a failure in one part of a page (a side panel, the review panel, photos) from taking the
 * rest of the page with it: the part shows what went wrong and a retry; the page stays usable.
 */
export class RegionBoundary extends Component<{ label: string; children: ReactNode }, State> {
  state: State = { failed: false, error: null };

  static getDerivedStateFromError(error: unknown): State {
    return { failed: true, error };
  }

  render() {
    if (!this.state.failed) return this.props.children;
    return (
      <div aria-label={this.props.label} role="region">
        <Problem
          error={this.state.error}
          subject={this.props.label}
          heading="h2"
          onRetry={() => this.setState({ failed: false, error: null })}
        />
      </div>
    );
  }
}
