import { Component, type ErrorInfo, type ReactNode } from 'react';
import { Alert } from './alert';
import { buttonClasses } from './button';

/**
 * An error boundary for one panel (a Card, an editor): when something inside cannot be drawn
 * (a stored document the editor does not understand, a renderer bug), only this panel shows a
 * calm message with "Try again"; the rest of the page keeps working.
 */
export class PanelBoundary extends Component<{ label?: ReactNode; children?: ReactNode }, { error: Error | null }> {
  override state: { error: Error | null } = { error: null };

  static getDerivedStateFromError(error: unknown) {
    return { error: error instanceof Error ? error : new Error(String(error)) };
  }

  override componentDidCatch(error: Error, info: ErrorInfo) {
    // kept in the browser console for whoever reports it; the page goes on
    console.warn('A panel could not be shown:', error, info.componentStack);
  }

  override render() {
    const { error } = this.state;
    if (!error) return this.props.children;
    return (
      <Alert tone="danger" title={this.props.label ? <>This part could not be shown: {this.props.label}</> : 'This part of the page could not be shown'}>
        <p>{error.message.length > 200 ? `${error.message.slice(0, 197)}...` : error.message}</p>
        <p className="mt-1">The rest of the page works; nothing you saved is lost.</p>
        <button type="button" className={`${buttonClasses('secondary', 'sm')} mt-2`} onClick={() => this.setState({ error: null })}>
          Try again
        </button>
      </Alert>
    );
  }
}
