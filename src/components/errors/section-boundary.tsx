import { Component } from 'react';
import type { ErrorInfo, ReactNode } from 'react';
import { ErrorAlert } from '../ui/alert';

interface SectionBoundaryProps {
  /** What the section shows, for the message ("the team could not be shown"). */
  name: string;
  children: ReactNode;
}

interface SectionBoundaryState {
  error: unknown;
}

/** Keeps one failing section from taking the whole page down. */
export class SectionBoundary extends Component<SectionBoundaryProps, SectionBoundaryState> {
  state: SectionBoundaryState = { error: null };

  static getDerivedStateFromError(error: unknown): SectionBoundaryState {
    return { error };
  }

  componentDidCatch(error: unknown, info: ErrorInfo): void {
    console.error(`Section "${this.props.name}" failed`, error, info.componentStack);
  }

  render(): ReactNode {
    if (this.state.error) {
      return <ErrorAlert error={this.state.error} title={`The ${this.props.name} could not be shown`} onRetry={() => this.setState({ error: null })} />;
    }
    return this.props.children;
  }
}
