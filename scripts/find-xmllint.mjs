// Makes sure `xmllint` (libxml2) is on the PATH for the WaterML tests, which validate every WaterML 2.0
// document against the OGC schemas carried in test/fixtures/waterml2. Installs Debian's libxml2-utils when
// missing on Debian or Ubuntu run as root; otherwise stops with the one line that installs it.
import { spawnSync } from 'node:child_process';
import { aptInstall, canAptInstall } from './apt-install.mjs';

const hasXmllint = () => spawnSync('xmllint', ['--version'], { stdio: 'ignore' }).status === 0;

/** Returns when xmllint runs, installing it if possible; exits with the install line otherwise. */
export function ensureXmllint() {
  if (hasXmllint()) return;
  if (canAptInstall()) {
    console.log('No xmllint found: installing Debian’s libxml2-utils with apt-get…');
    if (aptInstall('libxml2-utils') && hasXmllint()) return;
  }
  console.error('The WaterML tests need xmllint. Install it with:  sudo apt-get install -y libxml2-utils   (macOS: it comes with the system; Fedora: sudo dnf install libxml2)');
  process.exit(1);
}
