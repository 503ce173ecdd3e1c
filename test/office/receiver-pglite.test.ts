// The bundle protocol against the embedded database (PGlite) in a temp folder, one folder for the file.
import { describeProtocol } from '../support/office/protocol-suite';
import { pgliteEngine } from '../support/office/receiver-under-test';

describeProtocol(pgliteEngine(4581, 'freshet-office-'));
