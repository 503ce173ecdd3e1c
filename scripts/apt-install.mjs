// Installs a Debian package with apt-get when this is Debian or Ubuntu run as root (as CI runs); the
// callers print the one line that installs it by hand otherwise.
import { existsSync, readFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';

/** True when apt-get may be used here: Debian or Ubuntu, run as root. */
export function canAptInstall() {
  const osRelease = existsSync('/etc/os-release') ? readFileSync('/etc/os-release', 'utf8') : '';
  const debianLike = /^(ID|ID_LIKE)=.*\b(debian|ubuntu)\b/m.test(osRelease);
  const root = typeof process.getuid === 'function' && process.getuid() === 0;
  return debianLike && root;
}

/** Runs `apt-get update` then `apt-get install -y <pkg>`; true when both succeeded. */
export function aptInstall(pkg) {
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const update = spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  if (update.status !== 0) return false;
  return spawnSync('apt-get', ['install', '-y', '-qq', pkg], { stdio: 'inherit', env }).status === 0;
}
