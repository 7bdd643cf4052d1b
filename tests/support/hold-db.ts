// Opens the embedded database in the folder given and holds it until stdin closes (for the lock test).
import { openDatabase } from '../../db/client';

const dir = process.argv[2];
const d = await openDatabase({ dataDir: dir });
process.stdout.write('ready\n');
process.stdin.resume();
process.stdin.on('end', async () => {
  await d.close();
  process.exit(0);
});
