// The receiver's robustness tests (what it cannot store, strangers, pull by device) on PGlite in a temp folder.
import { pgliteEngine } from '../support/office/receiver-under-test';
import { describeRobustness } from '../support/office/robustness-suite';

describeRobustness(pgliteEngine(4641, 'freshet-office-robust-'));
