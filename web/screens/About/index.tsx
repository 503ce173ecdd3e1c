// About: what Freshet is, the cautions, the version, the storage state and display preferences.
import { useEffect, useState } from 'preact/hooks';
import { Cautions } from '../../components/Cautions';
import { checkForUpdate, offlineReady, updateStatus } from '../../app/updates';
import { themeChoice, type ThemeChoice } from '../../app/theme';
import { useStore } from '../../store';
import { storageState, type StorageState } from '../../db';

function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 ** 2) return `${(bytes / 1024).toFixed(1)} KiB`;
  if (bytes < 1024 ** 3) return `${(bytes / 1024 ** 2).toFixed(1)} MiB`;
  return `${(bytes / 1024 ** 3).toFixed(2)} GiB`;
}

function persistenceText(s: StorageState): string {
  if (s.persisted === 'unsupported') return 'Not offered by this browser';
  return s.persisted ? 'Granted: the browser will not clear Freshet’s records to free space' : 'Not granted yet (asked at the first save)';
}

const THEMES: { value: ThemeChoice; label: string; hint: string }[] = [
  { value: 'system', label: 'Follow the phone', hint: 'light by day, dark when the phone is in dark mode' },
  { value: 'sunlight', label: 'Sunlight', hint: 'black on white, heavy lines, for low sun on the screen' },
  { value: 'night', label: 'Night', hint: 'dark colours, easy on the eyes in the truck at night' },
];

/** The About screen. */
export default function About() {
  const [storage, setStorage] = useState<StorageState>();
  const theme = useStore(themeChoice);
  const ready = useStore(offlineReady);
  const update = useStore(updateStatus);
  const [checking, setChecking] = useState(false);
  useEffect(() => {
    void storageState().then(setStorage);
  }, []);
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>About Freshet</h2>
      <p>
        Freshet records stage readings at the stream bank, turns them into discharge through each site's
        rating, keeps every record on this phone until it reaches the office, and gives a quick storm
        runoff estimate from the hydrograph. It works without a network.
      </p>
      <Cautions />
      <h3>This copy</h3>
      <dl class="facts">
        <dt>Version</dt>
        <dd data-testid="app-version">{__APP_VERSION__}</dd>
        <dt>Works offline</dt>
        <dd>{ready ? 'Yes: the app is saved on this device' : 'Not yet: open it once with a network'}</dd>
        <dt>Persistent storage</dt>
        <dd data-testid="persisted">{storage ? persistenceText(storage) : 'Checking…'}</dd>
        <dt>Space used</dt>
        <dd data-testid="quota">
          {storage?.usage_bytes !== undefined && storage.quota_bytes
            ? `${formatBytes(storage.usage_bytes)} of ${formatBytes(storage.quota_bytes)} (${((100 * storage.usage_bytes) / storage.quota_bytes).toFixed(2)} %)`
            : storage ? 'Not reported by this browser' : 'Checking…'}
        </dd>
      </dl>
      <button
        type="button"
        class="wide"
        disabled={checking}
        onClick={async () => {
          setChecking(true);
          await checkForUpdate();
          setChecking(false);
        }}
      >
        {checking ? 'Checking for a new version…' : 'Check for a new version'}
      </button>
      {update.kind === 'current' && !checking && <p class="muted" role="status">Updates are also checked when the app comes to the foreground.</p>}
      <fieldset>
        <legend>Colours</legend>
        {THEMES.map((t) => (
          <label class="choice" key={t.value}>
            <input type="radio" name="theme" value={t.value} checked={theme === t.value} onChange={() => themeChoice.set(t.value)} />
            <span>
              {t.label}
              <span class="hint">{t.hint}</span>
            </span>
          </label>
        ))}
      </fieldset>
    </>
  );
}
