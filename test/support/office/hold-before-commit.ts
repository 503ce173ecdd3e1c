// A receiver process for the crash test: it adds a device, prints "ready <token>", and when a push reaches
// the point just before COMMIT it prints "holding <record versions visible inside the transaction>" and
// waits there for ever, so the test can kill it in the middle of storing a bundle.
// Arguments: (--data <folder> | --database <url>) <port>
import { createDevice } from '../../../office/receiver/devices';
import { createReceiver } from '../../../office/receiver/http';
import { openOfficeDatabase } from '../../../office/receiver/open';

const [flag, where, port] = process.argv.slice(2);
const db = await openOfficeDatabase(flag === '--data' ? { data: where } : { database: where });
const token = await createDevice(db, 'phone A');
const server = createReceiver({
  db,
  origins: [],
  log: () => {},
  store: {
    beforeCommit: async (tx) => {
      const [r] = await tx.query<{ n: string }>('select count(*)::text as n from record_versions');
      process.stdout.write(`holding ${r.n}\n`);
      await new Promise(() => {});
    },
  },
});
server.listen(Number(port), '127.0.0.1', () => process.stdout.write(`ready ${token}\n`));
