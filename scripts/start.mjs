// `npm start`: install if needed, build, and serve the production build on http://127.0.0.1:4173.
import { spawnSync, spawn } from 'node:child_process';
import { ensureInstall } from './ensure-install.mjs';

ensureInstall();
const build = spawnSync(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });
if (build.status !== 0) process.exit(build.status ?? 1);
console.log('\nFreshet is at http://127.0.0.1:4173/  (Ctrl+C to stop)\n');
const server = spawn(process.execPath, ['node_modules/vite/bin/vite.js', 'preview', '--host', '127.0.0.1', '--port', '4173', '--strictPort'], { stdio: 'inherit' });
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => server.kill(sig));
server.on('exit', (code) => process.exit(code ?? 0));
