import { QueryTypes, type Sequelize } from 'sequelize';
import { User } from '../models';
import { recordAudit } from '../services/audit.service';
import { createAcquisition, createEntry, setAcquisitionPrints } from '../services/acquisition.service';
import { proposeTreatment } from '../services/treatment.service';
import { DEMO_ACCOUNTS } from './demo-accounts';

/**
 * The invented procedure records of the demo: three object entries (2019, 2021, 2024), an acquisition
 * from the first that accessioned the prints numbered 2019.*, a treatment signed in 2023 and one
 * proposed recently, and the deaccession record of one print already deaccessioned. Dates follow
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
  const [gone] = await sequelize.query<{ id: string }>(`SELECT id FROM prints WHERE status = 'deaccessioned' ORDER BY accession_sort LIMIT 1`, { type: QueryTypes.SELECT });
  if (gone) {
    await sequelize.query(`UPDATE prints SET deaccessioned_on = '2024-06-14' WHERE id = $1`, { bind: [gone.id] });
    const [{ id }] = await sequelize.query<{ id: string }>(
      `INSERT INTO deaccessions (print_id, status, proposed_on, proposed_by, proposed_by_name, reason, method, authority, approved_on, completed_on, completed_by_name, final_note, created_at, updated_at)
       VALUES ($1, 'completed', '2024-02-05', $2, $3, 'Mould growth and water damage from the 2023 roof leak; the image is lost over most of its area', 'destruction',
         'Collections Committee, minute 2024/17', '2024-04-22', '2024-06-14', $3, 'Destroyed in the presence of two staff; photographs and the certificate of destruction filed', '2024-02-05T09:00:00Z', '2024-06-14T15:00:00Z') RETURNING id`,
      { bind: [gone.id, registrar.id, registrar.name], type: QueryTypes.SELECT },
    );
    await recordAudit({ actor: registrar, action: 'deaccession.completed', entityType: 'deaccession', entityId: id, after: { printId: gone.id, status: 'completed' }, requestId: 'seed' });
  }
  return true;
}
