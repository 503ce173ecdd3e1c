// The photo-bytes endpoint against the embedded database (PGlite) in a temp folder.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openOfficeDatabase } from '../../office/receiver/open';
import { describeBlobs } from '../support/office/blob-suite';

const dir = mkdtempSync(join(tmpdir(), 'freshet-blobs-'));
describeBlobs({
  name: 'PGlite',
  port: 0,
  open: () => openOfficeDatabase({ data: dir }),
  dispose: async () => rmSync(dir, { recursive: true, force: true }),
});
