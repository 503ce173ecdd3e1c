// The notice that a new version is ready. The new version takes over only when the user accepts. The
// shell (web/app/updates.ts) passes the state and what each button does; a component never imports it.

/** Where an update stands, as the notice shows it. */
export type UpdateNoticeState =
  | { kind: 'current' }
  | { kind: 'ready' }
  | { kind: 'applying' }
  | { kind: 'failed'; message: string }
  | { kind: 'changed-elsewhere' };

/** What the notice's buttons do: start the new version, put it off, acknowledge a failure. */
export interface UpdateNoticeActions {
  onAccept: () => void;
  onLater: () => void;
  onFailureSeen: () => void;
}

/** Shows the update state when there is something to say, and nothing otherwise. */
export function UpdateNotice({ status, onAccept, onLater, onFailureSeen }: { status: UpdateNoticeState } & UpdateNoticeActions) {
  switch (status.kind) {
    case 'current':
      return null;
    case 'ready':
      return (
        <div class="notice" role="status" data-testid="update-notice">
          <p>A new version of Freshet is ready. Your open form is saved before it starts.</p>
          <button type="button" onClick={onAccept}>Start new version</button>
          <button type="button" onClick={onLater} aria-label="Later: keep working in this version">Later</button>
        </div>
      );
    case 'applying':
      return <div class="notice" role="status"><p>Saving your work and starting the new version…</p></div>;
    case 'failed':
      return (
        <div class="notice" role="alert">
          <p>{status.message}</p>
          <button type="button" onClick={onFailureSeen}>OK</button>
        </div>
      );
    case 'changed-elsewhere':
      return (
        <div class="notice" role="status">
          <p>A newer version started in another tab. Reload this one when your work here is saved.</p>
          <button type="button" onClick={() => location.reload()}>Reload now</button>
        </div>
      );
  }
}
