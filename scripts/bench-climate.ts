/**
 * The storage-climate scenario of `npm run bench` ("climate file, 100,000 rows"): a logger file of
 * 100,000 ten-minute readings (local time in Europe/London, day-first, °F, so every reader is used)
 * goes through the service as the API runs it (upload, check, accept), on a fresh PostgreSQL of the
 * test setup; prints each step's time and the readings written. Run alone with
 * `npm run bench -- --only climate`.
 */
import { startLocalServices } from './services';

const ROWS = Number(process.env.BENCH_CLIMATE_ROWS ?? 100_000);
const log = (m: string) => console.log(`[bench:climate] ${m}`);
const services = await startLocalServices('test', () => {});
let code = 0;
try {
  Object.assign(process.env, services.env, { LOG_LEVEL: 'warn' });
  const { db } = await import('../backend/src/db');
  const { migrateUp } = await import('../backend/src/migrate');
  const { seedDemoIfEmpty } = await import('../backend/src/seed/demo');
  const { Location, User } = await import('../backend/src/models');
  const { uploadClimateFile, checkClimateFile, acceptClimateFile } = await import('../backend/src/services/climate-file.service');
  await migrateUp(db());
  await seedDemoIfEmpty(db(), { catalogue: false });
  const user = (await User.findOne({ where: { role: 'conservator' } }))!;
  const actor = { id: user.id, name: user.name, role: user.role };
  const room = await Location.create({ name: 'Bench store', kind: 'room', parentId: null, code: null, notes: null, pathLabel: 'Bench store' });

  // Local times from 1 January 2024, every 10 minutes, in Europe/London: the rows skip the hour the clocks go forward and repeat the one they go back.
  const { DateTime } = await import('luxon');
  const lines = ['Date Time,Temp (°F),RH (%)'];
  let at = DateTime.fromISO('2024-01-01T00:00', { zone: 'Europe/London' });
  for (let i = 0; i < ROWS; i++) {
    const f = 59 + 5 * Math.sin(i / 144) + (i % 7) / 10;
    lines.push(`${at.toFormat('dd/MM/yyyy HH:mm')},${f.toFixed(1)},${(42 + 6 * Math.cos(i / 500)).toFixed(1)}`);
    at = at.plus({ minutes: 10 });
  }
  const text = `${lines.join('\n')}\n`;
  const mapping = { timestampColumn: 'Date Time', timeZone: 'Europe/London', dateOrder: 'day-first', temperatureColumn: 'Temp (°F)', temperatureUnit: 'F', rhColumn: 'RH (%)' } as const;

  const t0 = performance.now();
  const up = await uploadClimateFile(room.id, { name: 'bench.csv', text }, actor, 'bench');
  const t1 = performance.now();
  const checked = await checkClimateFile(up.id, mapping);
  const t2 = performance.now();
  if (checked.check!.badRows > 0) throw new Error(`bad rows: ${JSON.stringify(checked.check!.problems.slice(0, 3))}`);
  const accepted = await acceptClimateFile(up.id, mapping, actor, 'bench');
  const t3 = performance.now();
  const [[{ n }]] = (await db().query('SELECT count(*)::int AS n FROM climate_readings WHERE location_id = $1', { bind: [room.id] })) as unknown as [[{ n: number }]];
  log(`climate file, ${ROWS.toLocaleString('en-GB')} rows (${(text.length / 1024 / 1024).toFixed(1)} MB): upload ${(t1 - t0).toFixed(0)} ms, check ${(t2 - t1).toFixed(0)} ms, accept ${(t3 - t2).toFixed(0)} ms; check + accept ${((t3 - t1) / 1000).toFixed(2)} s; ${accepted.acceptedRows?.toLocaleString('en-GB')} readings written (${n.toLocaleString('en-GB')} held)`);
  await db().close();
} catch (err) {
  console.error(err instanceof Error ? err.stack ?? err.message : err);
  code = 1;
} finally {
  await services.stop();
}
process.exit(code);
