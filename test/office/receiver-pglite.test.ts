// The bundle protocol against the embedded database (PGlite) in a temp folder, one folder for the file.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openOfficeDatabase } from '../../office/receiver/open';
import { describeProtocol } from '../support/office/protocol-suite';

const dir = mkdtempSync(join(tmpdir(), 'freshet-office-'));
describeProtocol({
  name: 'PGlite',
  port: 4581,
  open: () => openOfficeDatabase({ data: dir }),
  dispose: async () => rmSync(dir, { recursive: true, force: true }),
});
