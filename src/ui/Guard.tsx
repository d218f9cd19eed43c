/**
 * A part of the screen that fails while drawing says so in words and leaves the rest of the app
 * working (header, case list, demo picker, the other panels). It tries again when `resetKey`
 * changes (another case opened, or an edit), so a repaired case draws normally.
 */
import { Component, type ComponentChildren } from 'preact';
import { currentCase } from './state';

interface Props {
  /** what this part is, for the message ("The map", "The release inputs") */
  what: string;
  resetKey: string;
  children: ComponentChildren;
}

interface State {
  error: string | null;
  key: string;
}

export class Guard extends Component<Props, State> {
  override state: State = { error: null, key: this.props.resetKey };

  static override getDerivedStateFromProps(props: Props, state: State): Partial<State> | null {
    return props.resetKey !== state.key ? { error: null, key: props.resetKey } : null;
  }

  override componentDidCatch(e: unknown): void {
    this.setState({ error: e instanceof Error ? e.message : String(e) });
  }

  render() {
    if (this.state.error === null) return this.props.children;
    return (
      <div class="dg-guard" role="alert" data-testid="guard-message">
        <p>
          <strong>{this.props.what} could not be shown</strong> for this case: {this.state.error}
        </p>
        <p>The case is kept as it is. Correct the value named above, or open another case from Cases or Demo cases.</p>
      </div>
    );
  }
}

/**
 * A guard that tries again with every edit of the case on screen. It reads the case itself, so an
 * edit re-renders this guard and not the screen around it; its children are the parent's unchanged
 * elements, which Preact does not draw again (the panels inside follow the case by their own
 * subscriptions). Reading the case in the App instead redrew the whole screen on every keystroke.
 */
export function CaseGuard({ what, children }: { what: string; children: ComponentChildren }) {
  return (
    <Guard what={what} resetKey={currentCase.value.modified}>
      {children}
    </Guard>
  );
}
