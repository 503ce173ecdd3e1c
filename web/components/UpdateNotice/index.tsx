// The notice that a new version is ready. The new version takes over only when the user accepts.
import { acceptUpdate, updateStatus } from '../../app/updates';
import { useStore } from '../../store';

/** Shows the update state when there is something to say, and nothing otherwise. */
export function UpdateNotice() {
  const status = useStore(updateStatus);
  switch (status.kind) {
    case 'current':
      return null;
    case 'ready':
      return (
        <div class="notice" role="status" data-testid="update-notice">
          <p>A new version of Freshet is ready. Your open form is saved before it starts.</p>
          <button type="button" onClick={() => void acceptUpdate()}>Start new version</button>
          <button type="button" onClick={() => updateStatus.set({ kind: 'current' })} aria-label="Later: keep working in this version">Later</button>
        </div>
      );
    case 'applying':
      return <div class="notice" role="status"><p>Saving your work and starting the new version…</p></div>;
    case 'failed':
      return (
        <div class="notice" role="alert">
          <p>{status.message}</p>
          <button type="button" onClick={() => updateStatus.set({ kind: 'ready' })}>OK</button>
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
