/**
 * The inspection-schedule scenario of `npm run bench` ("schedule, full recompute"): a full recompute
 * of every print's next-inspection date on the toneledger_scale database (`npm run seed:scale`), run
 * as the `schedule-recompute` job runs it (batches of 5,000, each its own transaction: inputs loaded
 * in a few set-based statements, the model, one upsert). Prints the total, the rate, and one batch
 * split into loading, the model and the write. Run alone with `npm run bench -- --only schedule`.
 */
import { DEV_PG_PORT, openDevCluster } from './dev-cluster';
import { startLocalServices } from './services';

const log = (m: string) => console.log(`[bench:schedule] ${m}`);
const pgPort = DEV_PG_PORT;

let cluster: { stop(): Promise<void> } | null = null;
const services = await startLocalServices('test', () => {});
let code = 0;
try {
  cluster = await openDevCluster(log);
  Object.assign(process.env, services.env, { DATABASE_URL: `postgres://app@127.0.0.1:${pgPort}/toneledger_scale`, LOG_LEVEL: 'warn' });
  const { db } = await import('../backend/src/db');
  const { migrateUp } = await import('../backend/src/migrate');
  const { Setting } = await import('../backend/src/models');
  const { startScheduleRecompute, settleScheduleRecompute, scheduleRecomputeProgress, SCHEDULE_BATCH } = await import('../backend/src/services/schedule-jobs');
  const { loadRiskInputs } = await import('../backend/src/services/schedule-inputs');
  const { recomputeSchedules } = await import('../backend/src/services/schedule.service');
  const { assessPrint } = await import('../common/src/domain/inspection-risk');
  const { todayIso } = await import('../backend/src/services/display-rows');
  await migrateUp(db());
  const [[{ n }]] = (await db().query('SELECT count(*)::int AS n FROM prints')) as unknown as [[{ n: number }]];
  if (n === 0) throw new Error('toneledger_scale is empty: npm run seed:scale -- --prints 200000');

  // One batch, stage by stage (the first 5,000 prints by id).
  const [ids] = (await db().query(`SELECT id FROM prints ORDER BY id LIMIT ${SCHEDULE_BATCH}`)) as unknown as [{ id: string }[]];
  const batch = ids.map((r) => r.id);
  const a0 = performance.now();
  const inputs = await loadRiskInputs(batch, todayIso());
  const a1 = performance.now();
  for (const input of inputs.values()) assessPrint(input);
  const a2 = performance.now();
  await db().transaction((t) => recomputeSchedules(batch, t));
  const a3 = performance.now();
  log(`one batch of ${batch.length.toLocaleString('en-GB')}: inputs ${(a1 - a0).toFixed(0)} ms, model ${(a2 - a1).toFixed(0)} ms, load + model + upsert ${(a3 - a2).toFixed(0)} ms`);

  // A recompute a stopped run left "running" would refuse the start: it is this bench's own row on the scale database.
  await Setting.destroy({ where: { key: 'schedule-recompute' } });
  const t0 = performance.now();
  await startScheduleRecompute(null);
  await settleScheduleRecompute();
  const t1 = performance.now();
  const p = await scheduleRecomputeProgress();
  if (p?.status !== 'done') throw new Error(`recompute ended ${p?.status}`);
  log(`schedule, full recompute of ${p.done.toLocaleString('en-GB')} prints: ${((t1 - t0) / 1000).toFixed(1)} s (${Math.round(p.done / ((t1 - t0) / 1000)).toLocaleString('en-GB')} prints/s); target: minutes, not hours`);
  await db().close();
} catch (err) {
  console.error(err instanceof Error ? err.stack ?? err.message : err);
  code = 1;
} finally {
  await services.stop();
  await cluster?.stop();
}
process.exit(code);
