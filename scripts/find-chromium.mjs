// Finds a Chromium or Chrome for the browser tests; installs Debian's `chromium` when none is found
// and this is Debian or Ubuntu run as root; otherwise stops with the one line that installs it.
import { existsSync } from 'node:fs';
import { aptInstall, canAptInstall } from './apt-install.mjs';

const CANDIDATES = ['/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/bin/google-chrome', '/usr/bin/google-chrome-stable'];

/** Returns a Chromium path (also exported as CHROMIUM_PATH for the tests), installing one if possible. */
export function ensureChromium() {
  const named = process.env.CHROMIUM_PATH;
  if (named) {
    if (existsSync(named)) return named;
    console.error(`CHROMIUM_PATH is set to ${named}, but there is no such file.`);
    process.exit(1);
  }
  let found = CANDIDATES.find((p) => existsSync(p));
  if (!found && canAptInstall()) {
    console.log('No Chromium found: installing Debian’s chromium with apt-get…');
    if (aptInstall('chromium')) found = CANDIDATES.find((p) => existsSync(p));
  }
  if (!found) {
    console.error('The browser tests need Chromium. Install it with:  sudo apt-get install -y chromium   (or set CHROMIUM_PATH)');
    process.exit(1);
  }
  process.env.CHROMIUM_PATH = found;
  return found;
}
