// The receiver's robustness tests (what it cannot store, strangers, pull by device) on PGlite in a temp folder.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openOfficeDatabase } from '../../office/receiver/open';
import { describeRobustness } from '../support/office/robustness-suite';

const dir = mkdtempSync(join(tmpdir(), 'freshet-office-robust-'));
describeRobustness({
  name: 'PGlite',
  port: 4641,
  open: () => openOfficeDatabase({ data: dir }),
  dispose: async () => rmSync(dir, { recursive: true, force: true }),
});
