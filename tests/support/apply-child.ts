// A separate process that applies a price list and stops half-way through its transaction, waiting
// to be killed (tests/api/price-lists.test.ts kills it with SIGKILL and checks nothing stayed behind).
import { createDb } from '../../server/db/client.ts';
import { createSearchClient } from '../../server/search/client.ts';
import { createPartsIndex } from '../../server/search/parts-index.ts';
import { createPriceListService } from '../../server/services/price-lists.ts';

const [dbUrl, searchUrl, importId, userId] = process.argv.slice(2) as [string, string, string, string];
const db = createDb(dbUrl, { max: 2 });
const service = createPriceListService({ db, partsIndex: createPartsIndex(createSearchClient({ host: searchUrl })) });
await service.apply({ userId, name: 'Child', email: 'child@stackyard.test', role: 'purchasing', companyId: null }, importId, async (done) => {
  if (done === 3) {
    // Supplier parts and price history are written (uncommitted) by now.
    process.stdout.write('HALF\n');
    await new Promise(() => {});
  }
});
