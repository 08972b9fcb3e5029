import { QueryTypes, type Sequelize } from 'sequelize';
import { User } from '../models';
import { recordAudit } from '../services/audit.service';
import { createAcquisition, createEntry, setAcquisitionPrints } from '../services/acquisition.service';
import { proposeTreatment } from '../services/treatment.service';
import { DEMO_ACCOUNTS } from './demo-accounts';

/** Invented reasons the demo's deaccessioned prints left, in turn (month-day of each step within the year). */
const DEACCESSION_STORIES = [
  { year: 2024, proposed: '02-05', approved: '04-22', completed: '06-14', method: 'destruction', recipient: null, authority: 'Collections Committee, minute 2024/17',
    reason: 'Mould growth and water damage from the 2023 roof leak; the image is lost over most of its area',
    finalNote: 'Destroyed in the presence of two staff; photographs and the certificate of destruction filed' },
  { year: 2012, proposed: '03-12', approved: '05-30', completed: '09-03', method: 'transfer', recipient: 'Saltmarsh Regional Archive', authority: 'Board of Trustees, minute 2012/09',
    reason: 'A second print of the same negative; the regional archive holds the photographer’s papers and asked for it',
    finalNote: 'Transferred with its file; receipt SRA/2012/44 filed' },
  { year: 2016, proposed: '01-18', approved: '03-07', completed: '04-26', method: 'return', recipient: 'The estate of the photographer', authority: 'Board of Trustees, minute 2016/03',
    reason: 'Found to have been lent, not given: the 1986 letter names it a loan',
    finalNote: 'Returned to the estate’s executor against signature; the letter and receipt filed' },
  { year: 2020, proposed: '10-05', approved: '11-23', completed: '12-14', method: 'transfer', recipient: 'Pellow Point Maritime Museum', authority: 'Collections Committee, minute 2020/31',
    reason: 'Outside the collecting policy since 2019 (ship portraits); the maritime museum collects them',
    finalNote: 'Transferred by courier in a sealed box; condition report signed at both ends' },
] as const;

/**
 * The invented procedure records of the demo: three object entries (2019, 2021, 2024), an acquisition
 * from the first that accessioned the prints numbered 2019.*, a treatment signed in 2023 and one
 * proposed recently, and the deaccession record of every print the demo catalogue deaccessioned. Dates follow
 * each other; signed records carry the day of their signing, not the day of the seed. Runs once
 * (nothing is written when an entry exists).
 */
export async function seedDemoProceduresIfEmpty(sequelize: Sequelize, log: (m: string) => void): Promise<boolean> {
  const [{ entries, prints }] = await sequelize.query<{ entries: number; prints: number }>(
    'SELECT (SELECT count(*)::int FROM object_entries) AS entries, (SELECT count(*)::int FROM prints) AS prints', { type: QueryTypes.SELECT },
  );
  if (entries > 0 || prints === 0) return false;
  log('Writing the demo entries, acquisitions, treatments and a deaccession…');
  const actorOf = async (role: 'registrar' | 'conservator') => {
    const a = DEMO_ACCOUNTS.find((x) => x.role === role)!;
    const u = await User.findOne({ where: { email: a.email } });
    return { id: u?.id ?? null, name: u?.name ?? a.name, role };
  };
  const registrar = await actorOf('registrar');
  const conservator = await actorOf('conservator');
  const e1 = await createEntry({ enteredOn: '2019-03-14', depositor: 'Orla Fenwick', depositorContact: '4 Ropewalk Row, Calder Reach', reason: 'possible_acquisition', objectCount: 4, objectsDescription: 'Four toned gelatin silver prints of the harbour, mounted, in a card box', returnBy: '2019-09-30', notes: null }, registrar, 'seed');
  await createEntry({ enteredOn: '2021-06-02', depositor: 'Tobias Quarrie', depositorContact: null, reason: 'enquiry', objectCount: 1, objectsDescription: 'One brown-toned print, unmounted, for an opinion on its toning', returnBy: '2021-06-30', notes: 'Returned 2021-06-18.' }, registrar, 'seed');
  await createEntry({ enteredOn: '2024-10-08', depositor: 'Saltmarsh Photographic Society', depositorContact: 'The Secretary, Saltmarsh Hall', reason: 'loan_in', objectCount: 2, objectsDescription: 'Two selenium-toned exhibition prints lent for study', returnBy: '2025-04-08', notes: null }, registrar, 'seed');
  const acq = await createAcquisition({ entryId: e1.id, source: 'Orla Fenwick', method: 'gift', approvedOn: '2019-05-21', acquiredOn: '2019-06-03', titleDocument: 'Deed of gift CR/DG/2019/02', funds: null, notes: null }, registrar, 'seed');
  const ids = (await sequelize.query<{ id: string }>(`SELECT id FROM prints WHERE accession_number LIKE '2019.%' AND status <> 'deaccessioned' ORDER BY accession_sort LIMIT 4`, { type: QueryTypes.SELECT })).map((r) => r.id);
  if (ids.length) await setAcquisitionPrints(acq.id, { add: ids, remove: [], version: acq.version }, registrar, 'seed');

  const [stored] = await sequelize.query<{ id: string }>(`SELECT id FROM prints WHERE status = 'in_store' ORDER BY accession_sort LIMIT 2`, { type: QueryTypes.SELECT });
  const [other] = await sequelize.query<{ id: string }>(`SELECT id FROM prints WHERE status = 'in_store' ORDER BY accession_sort DESC LIMIT 1`, { type: QueryTypes.SELECT });
  if (stored) {
    // Written signed as it was in 2023 (the lock applies to changes, not to the record as written).
    const [{ id }] = await sequelize.query<{ id: string }>(
      `INSERT INTO treatments (print_id, status, conservator_id, conservator_name, proposed_on, condition_found, aims, options_considered, chosen_method,
         approved_by_name, approved_on, started_on, completed_on, hours_spent, summary, steps, materials, signed_at, created_at, updated_at)
       VALUES ($1, 'signed', $2, $3, '2023-02-20', 'Surface dirt and a 12 mm tear at the lower edge', 'Clean the surface; stabilise the tear', 'Dry cleaning alone; tear repair with tissue',
         'Dry surface cleaning; tear repair with wheat starch paste and a thin tissue', 'Ilse Marrow, Head of Collections', '2023-03-01', '2023-03-06', '2023-03-09', 5.5,
         'Surface cleaned; tear closed and supported from the verso.',
         $4::jsonb, $5::jsonb, '2023-03-10T16:20:00Z', '2023-02-20T10:00:00Z', '2023-03-10T16:20:00Z') RETURNING id`,
      {
        bind: [stored.id, conservator.id, conservator.name,
          JSON.stringify([{ on: '2023-03-06', description: 'Examined under raking light; dry-cleaned the recto with a soft brush and sponge', minutes: 90 }, { on: '2023-03-08', description: 'Repaired the tear with wheat starch paste and tissue, dried under light weight', minutes: 150 }]),
          JSON.stringify([{ kind: 'material', name: 'Wheat starch paste', batchOrProduct: 'Cooked 2023-03-08', notes: null }, { kind: 'material', name: 'Tissue, 9 g/m²', batchOrProduct: 'Roll 14', notes: null }])],
        type: QueryTypes.SELECT,
      },
    );
    await recordAudit({ actor: conservator, action: 'treatment.signed', entityType: 'treatment', entityId: id, after: { printId: stored.id, status: 'signed' }, requestId: 'seed' });
  }
  if (other) {
    const today = new Date().toISOString().slice(0, 10);
    await proposeTreatment(other.id, { proposedOn: today, conditionFound: 'Silver mirroring in the shadows along the upper margin', aims: 'Reduce the mirroring without touching the image', optionsConsidered: 'Leave as is and watch it; local treatment', chosenMethod: 'Local treatment at the margin, cleared and washed' }, conservator, 'seed');
  }
  // Every print the demo catalogue marked deaccessioned gets its completed record, each dated after
  // its accession year and before today, so no print has left without saying when, how and why.
  const gone = await sequelize.query<{ id: string; year: number }>(
    `SELECT id, split_part(accession_number, '.', 1)::int AS year FROM prints WHERE status = 'deaccessioned' ORDER BY accession_sort`, { type: QueryTypes.SELECT },
  );
  for (const [i, g] of gone.entries()) {
    const story = DEACCESSION_STORIES[i % DEACCESSION_STORIES.length];
    // The year the print left: the story's own, or the year after the accession when that is later (kept before this year).
    const year = Math.min(Math.max(story.year, g.year + 1), new Date().getUTCFullYear() - 1);
    const on = (monthDay: string) => `${year}-${monthDay}`;
    await sequelize.query(`UPDATE prints SET deaccessioned_on = $2 WHERE id = $1`, { bind: [g.id, on(story.completed)] });
    const [{ id }] = await sequelize.query<{ id: string }>(
      `INSERT INTO deaccessions (print_id, status, proposed_on, proposed_by, proposed_by_name, reason, method, recipient, authority, approved_on, completed_on, completed_by_name, final_note, created_at, updated_at)
       VALUES ($1, 'completed', $4, $2, $3, $5, $6, $7, $8, $9, $10, $3, $11, ($4::date + time '09:00') AT TIME ZONE 'UTC', ($10::date + time '15:00') AT TIME ZONE 'UTC') RETURNING id`,
      {
        bind: [g.id, registrar.id, registrar.name, on(story.proposed), story.reason, story.method, story.recipient, story.authority, on(story.approved), on(story.completed), story.finalNote],
        type: QueryTypes.SELECT,
      },
    );
    await recordAudit({ actor: registrar, action: 'deaccession.completed', entityType: 'deaccession', entityId: id, after: { printId: g.id, status: 'completed' }, requestId: 'seed' });
  }
  return true;
}
