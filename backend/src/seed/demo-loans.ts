import { QueryTypes } from 'sequelize';
import { categoryByRules } from '@toneledger/common/domain/light-rules';
import type { LoanConditions } from '@toneledger/common/schemas/loans';
import { db } from '../db';
import { getLightSettings } from '../services/light-settings.service';
import { seedToday } from './demo-condition';
import { writeLoan, type Actor, type LoanPlan } from './demo-loan-writer';
import { inPool } from './pool';
import { addDays, CLOSED_MONDAYS, holidaysIn, planRotations, writeExhibition, type ExhibitionPlan, type RotationPrint } from './demo-exhibitions';

/**
 * Exhibitions and loans of the (invented) demo collection, written after its catalogue, condition
 * and measurement histories, through the services:
 * - a spring rotation of the print room every year since 1994;
 * - a touring show of the last year with three venues, its second and third venues covered by two
 *   loans out that went all the way to returned, with signed outgoing and returning reports; its
 *   three iron-blue prints have used their annual light budget and owe rest;
 * - a loan out agreed for a coming exhibition elsewhere, whose planned displays would take its
 *   iron-blue print past its budget (the warning shows before anything leaves);
 * - a loan in on loan now (three prints lent by an archive, shown in a current exhibition);
 * - a loan out proposed and one declined;
 * - iron-blue prints with four or more measurement sessions shown at reduced light in rotations
 *   between their sessions, so the light-cost fit has exposure to work with.
 * Dates of the recent shows and loans are counted from the day of the seed. Everything is matched
 * by exhibition title and loan reference, so an interrupted seed is completed, not repeated.
 */

interface Candidate {
  id: string;
  accessionNumber: string;
  category: string;
  ironBlue: boolean;
  status: string;
}


const PRINT_CONDITIONS: LoanConditions = {
  maxLux: 50, maxAnnualLuxHours: null, temperatureMinC: 16, temperatureMaxC: 21, rhMinPercent: 40, rhMaxPercent: 50,
  noAlkalineBufferedMounts: true, other: 'Frames to stay sealed; no photography with flash.',
};


async function candidates(): Promise<Candidate[]> {
  const settings = await getLightSettings();
  const rows = await db().query<{ id: string; accessionNumber: string; process: string; tonerClasses: string[]; status: string }>(
    `SELECT p.id, p.accession_number AS "accessionNumber", p.process, p.toner_classes AS "tonerClasses", p.status
       FROM prints p WHERE NOT p.borrowed AND p.status IN ('in_store', 'on_display') ORDER BY p.accession_sort`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((p) => ({
    id: p.id, accessionNumber: p.accessionNumber, status: p.status, ironBlue: (p.tonerClasses ?? []).includes('iron_blue'),
    category: categoryByRules(settings, p.process, p.tonerClasses ?? []),
  }));
}

/** Comparable (D50/2°) session days of each print measured four times or more. */
async function sessionDays(): Promise<Map<string, string[]>> {
  const rows = await db().query<{ printId: string; days: string[] }>(
    `SELECT print_id AS "printId", array_agg(measured_on::text ORDER BY measured_on) AS days FROM measurement_sessions
      WHERE illuminant = 'D50' AND observer = '2' GROUP BY print_id HAVING count(*) >= 4`,
    { type: QueryTypes.SELECT },
  );
  return new Map(rows.map((r) => [r.printId, r.days]));
}

/**
 * For a measured print: one rotation year inside each gap between consecutive sessions from the
 * second on (the baseline may have been moved to the second), so exposure falls between sessions.
 */
function yearsBetween(days: string[]): number[] {
  const years: number[] = [];
  for (let i = 1; i + 1 < days.length; i++) {
    const fits: number[] = [];
    for (let y = Number(days[i].slice(0, 4)); y <= Number(days[i + 1].slice(0, 4)); y++) {
      if (y >= 1994 && days[i] < `${y}-03-01` && `${y}-05-01` < days[i + 1]) fits.push(y);
    }
    if (fits.length) years.push(fits[Math.floor(fits.length / 2)]);
  }
  return years;
}

export interface DemoLoansResult {
  exhibitions: number;
  displays: number;
  loans: number;
  reports: number;
}

export async function seedDemoLoans(
  registrar: Actor, conservator: Actor, log: (m: string) => void, options: { signal?: AbortSignal } = {},
): Promise<DemoLoansResult> {
  const started = Date.now();
  const signal = options.signal;
  signal?.throwIfAborted();
  const T = seedToday();
  const d = (n: number) => addDays(T, n);
  const year = (date: string) => date.slice(0, 4);
  const all = await candidates();
  const used = new Set<string>();
  const take = (n: number, test: (c: Candidate) => boolean) => {
    const out = all.filter((c) => !used.has(c.id) && test(c)).slice(0, n);
    for (const c of out) used.add(c.id);
    return out.map((c) => c.id);
  };
  const inStore = (c: Candidate) => c.status === 'in_store';
  const blue = (c: Candidate) => c.ironBlue && c.category === 'high';

  // Measured iron-blue prints with room for displays between their sessions: the light-cost fit.
  const sessions = await sessionDays();
  const fit = all
    .filter((c) => blue(c) && sessions.has(c.id))
    .map((c) => ({ c, years: yearsBetween(sessions.get(c.id)!) }))
    .filter((x) => x.years.length >= 2)
    .slice(0, 4);
  for (const f of fit) used.add(f.c.id);

  const touringBlue = take(3, (c) => blue(c) && inStore(c) && !sessions.has(c.id));
  const touringOther = take(5, (c) => c.category === 'medium' && inStore(c) && !c.ironBlue);
  const touring = [touringBlue[0], ...touringOther.slice(0, 2), touringBlue[1], ...touringOther.slice(2), touringBlue[2]].filter(Boolean);
  const agreedBlue = take(1, (c) => blue(c) && inStore(c));
  const agreed = [...take(3, (c) => c.category === 'medium' && inStore(c) && !c.ironBlue), ...agreedBlue];
  const proposed = take(2, (c) => c.category === 'medium' && inStore(c));
  const declined = take(2, (c) => blue(c) && inStore(c));
  const pool = all.filter((c) => !used.has(c.id) && c.category === 'medium').map((c) => c.id);

  // ── Exhibitions ──
  const extra = new Map<number, RotationPrint[]>();
  for (const f of fit) for (const y of f.years) extra.set(y, [...(extra.get(y) ?? []), { id: f.c.id, lux: 25 }]);
  const lastRotation = Number(year(T)) - (T < `${year(T)}-03-01` ? 1 : 0);
  const plans: ExhibitionPlan[] = planRotations(pool, extra, lastRotation);

  const venues = [
    { name: 'Calder Reach, Long Gallery', place: 'Calder Reach', opensOn: d(-330), closesOn: d(-250) },
    { name: 'Tollmere Gallery', place: 'Easterbrook', opensOn: d(-215), closesOn: d(-140) },
    { name: 'Harbour Arts Centre', place: 'Wensley Bay', opensOn: d(-110), closesOn: d(-40) },
  ];
  const touringTitle = 'Blue and Silver: toned prints from Calder Reach';
  plans.push({
    title: touringTitle, organiser: 'Calder Reach Photographic Trust',
    summary: 'Iron-blue, selenium and sulfide toned prints from the collection, touring to two partner galleries after its opening at Calder Reach.',
    venues,
    displays: venues.flatMap((v, i) => touring.map((printId) => ({
      printId, venue: i, startsOn: v.opensOn, endsOn: v.closesOn, lux: 50, hoursPerDay: i === 0 ? 8 : 9,
      daysOpen: CLOSED_MONDAYS, closedDates: holidaysIn(v.opensOn, v.closesOn), caseOrFrame: 'Framed, glazed with UV-filtering acrylic',
    }))),
    approve: true,
  });
  const comingTitle = 'The Toned Print, 1920–1960';
  const coming = { name: 'Ashcombe Institute of Photography, North Gallery', place: 'Larkfield', opensOn: d(95), closesOn: d(200) };
  plans.push({
    title: comingTitle, organiser: 'Ashcombe Institute of Photography',
    summary: 'A survey of toning at mid-century, with four prints lent by Calder Reach.',
    venues: [coming],
    displays: agreed.map((printId) => ({
      printId, venue: 0, startsOn: coming.opensOn, endsOn: coming.closesOn, lux: 50, hoursPerDay: 9, daysOpen: CLOSED_MONDAYS,
      closedDates: holidaysIn(coming.opensOn, coming.closesOn), caseOrFrame: 'Framed by the borrower to the lender\'s specification',
    })),
    approve: false,
  });
  const watersTitle = 'Working Waters: harbour photographs from the Strand Mill archive';
  const waters = { name: 'Calder Reach, Study Gallery', place: 'Calder Reach', opensOn: d(-50), closesOn: d(60) };

  // ── Loans ──
  const loans: LoanPlan[] = [];
  const tollmere = venues[1];
  const harbour = venues[2];
  loans.push({
    reference: `CR-LO-${year(d(-222))}-04`, direction: 'out', otherInstitution: 'Tollmere Gallery', contactName: 'Agnes Colebrook', contactEmail: 'a.colebrook@tollmere.example',
    purpose: 'exhibition', exhibition: touringTitle, venue: `${tollmere.name}, ${tollmere.place}`,
    dispatchOn: d(-222), opensOn: tollmere.opensOn, closesOn: tollmere.closesOn, returnOn: d(-133), courier: 'Tamsin Wrey (Calder Reach), accompanying by road',
    conditions: PRINT_CONDITIONS, creditLine: 'Lent by Calder Reach Photographic Trust', notes: 'Second venue of the touring show.',
    prints: touring, borrowed: [],
    steps: [
      { to: 'approved', on: d(-400) }, { to: 'agreed', on: d(-300), note: 'Agreement signed by both directors.' },
      { to: 'in_transit', on: d(-222) }, { to: 'on_loan', on: d(-220), note: 'Unpacked and checked with the courier.' }, { to: 'returned', on: d(-133) },
    ],
    examined: { outgoing_loan: d(-224), returning_loan: d(-133) },
  });
  loans.push({
    reference: `CR-LO-${year(d(-118))}-09`, direction: 'out', otherInstitution: 'Harbour Arts Centre', contactName: 'Rafe Tregothnan', contactEmail: 'rafe.t@harbourarts.example',
    purpose: 'exhibition', exhibition: touringTitle, venue: `${harbour.name}, ${harbour.place}`,
    dispatchOn: d(-118), opensOn: harbour.opensOn, closesOn: harbour.closesOn, returnOn: d(-33), courier: 'Maren Oakshott (Calder Reach)',
    conditions: PRINT_CONDITIONS, creditLine: 'Lent by Calder Reach Photographic Trust', notes: 'Third and last venue of the touring show.',
    prints: touring, borrowed: [],
    steps: [
      { to: 'approved', on: d(-380) }, { to: 'agreed', on: d(-290) },
      { to: 'in_transit', on: d(-118) }, { to: 'on_loan', on: d(-116) }, { to: 'returned', on: d(-33), note: 'All prints back; returning reports signed.' },
    ],
    examined: { outgoing_loan: d(-120), returning_loan: d(-33) },
  });
  loans.push({
    reference: `CR-LO-${year(d(85))}-02`, direction: 'out', otherInstitution: 'Ashcombe Institute of Photography', contactName: 'Dr Lowenna Scobell', contactEmail: 'l.scobell@ashcombe.example',
    purpose: 'exhibition', exhibition: comingTitle, venue: `${coming.name}, ${coming.place}`,
    dispatchOn: d(85), opensOn: coming.opensOn, closesOn: coming.closesOn, returnOn: d(210), courier: 'Tamsin Wrey (Calder Reach)',
    conditions: { ...PRINT_CONDITIONS, maxAnnualLuxHours: 15000 }, creditLine: 'Lent by Calder Reach Photographic Trust',
    notes: 'The iron-blue print is asked for the whole run; discuss a shorter showing or a facsimile for part of it.',
    prints: agreed, borrowed: [],
    steps: [{ to: 'approved', on: d(-60) }, { to: 'agreed', on: d(-20), note: 'Agreement signed; light levels to be confirmed by the borrower.' }],
    examined: {},
  });
  loans.push({
    reference: `CR-LI-${year(d(-60))}-01`, direction: 'in', otherInstitution: 'Strand Mill Photographic Archive', contactName: 'Piran Nancarrow', contactEmail: 'collections@strandmill.example',
    purpose: 'exhibition', exhibition: watersTitle, venue: `${waters.name}`,
    dispatchOn: d(-60), opensOn: waters.opensOn, closesOn: waters.closesOn, returnOn: d(70), courier: "The lender's van, with its registrar",
    conditions: { ...PRINT_CONDITIONS, noAlkalineBufferedMounts: false, other: "Shown in the lender's frames." }, creditLine: 'Lent by Strand Mill Photographic Archive, Corleigh', notes: null,
    prints: [],
    borrowed: [
      { accessionNumber: 'SMA 1961/114', title: 'Coal staithes at low water', dateMade: '1958' },
      { accessionNumber: 'SMA 1961/131', title: 'Net lofts, Corleigh quay', dateMade: '1959' },
      { accessionNumber: 'SMA 1974/07', title: 'Dredger in the outer basin', dateMade: '1966' },
    ],
    steps: [
      { to: 'approved', on: d(-150) }, { to: 'agreed', on: d(-100) },
      { to: 'in_transit', on: d(-60) }, { to: 'on_loan', on: d(-58), note: 'Arrived; incoming reports signed.' },
    ],
    examined: { incoming: d(-58) },
  });
  loans.push({
    reference: `CR-LO-${year(d(150))}-05`, direction: 'out', otherInstitution: 'Kestle Bay Museum', contactName: 'Hedra Polglase', contactEmail: 'h.polglase@kestlebay.example',
    purpose: 'research', exhibition: null, venue: 'Kestle Bay Museum, study room',
    dispatchOn: d(150), opensOn: d(152), closesOn: d(180), returnOn: d(182), courier: null,
    conditions: { ...PRINT_CONDITIONS, other: 'Handled by museum staff only; no display.' }, creditLine: null, notes: 'Asked for a study of the papers used by the harbour photographers.',
    prints: proposed, borrowed: [], steps: [], examined: {},
  });
  loans.push({
    reference: `CR-LO-${year(d(-200))}-11`, direction: 'out', otherInstitution: 'Orrin Street Gallery', contactName: 'Wenna Trevail', contactEmail: 'wenna@orrinstreet.example',
    purpose: 'exhibition', exhibition: null, venue: 'Orrin Street Gallery, Pemberton',
    dispatchOn: d(-200), opensOn: d(-195), closesOn: d(-60), returnOn: d(-55), courier: null,
    conditions: { ...PRINT_CONDITIONS, maxLux: 100 }, creditLine: null, notes: 'Asked for two iron-blue prints for a four-month show in a daylit room.',
    prints: declined, borrowed: [],
    steps: [{ to: 'declined', on: d(-380), note: 'Declined: iron-blue toned prints cannot be shown at 100 lux in daylight for four months.' }],
    examined: {},
  });

  let exhibitions = 0;
  let displays = 0;
  let reports = 0;
  const written = new Map<string, string>();
  // The yearly rotations share no days, so three are written at a time; the rest in order.
  const rotations = plans.filter((p) => p.title.startsWith('Print room rotation'));
  const write = async (plan: ExhibitionPlan) => {
    const w = await writeExhibition(plan, registrar, conservator, signal);
    written.set(plan.title, w.id);
    exhibitions += w.created ? 1 : 0;
    displays += w.displays;
  };
  await inPool(rotations, 3, write, signal);
  for (const plan of plans) if (!rotations.includes(plan)) await write(plan);
  // The loan in first: its prints come with it, then the exhibition that shows them.
  let made = 0;
  for (const loan of loans) {
    if (loan.exhibition === watersTitle && !written.has(watersTitle)) {
      const w = await writeExhibition({ title: watersTitle, organiser: 'Calder Reach Photographic Trust', summary: 'Harbour and working-river photographs of the 1950s and 1960s, lent by the Strand Mill Photographic Archive.', venues: [waters], displays: [], approve: false }, registrar, conservator, signal);
      written.set(watersTitle, w.id);
      exhibitions += w.created ? 1 : 0;
    }
    const r = await writeLoan(loan, loan.exhibition ? written.get(loan.exhibition)! : null, registrar, conservator, signal);
    made += r.created ? 1 : 0;
    reports += r.reports;
    if (loan.direction === 'in') {
      const w = await writeExhibition({
        title: watersTitle, organiser: 'Calder Reach Photographic Trust', summary: '', venues: [waters],
        displays: r.printIds.map((printId) => ({
          printId, venue: 0, startsOn: waters.opensOn, endsOn: waters.closesOn, lux: 50, hoursPerDay: 8, daysOpen: CLOSED_MONDAYS,
          closedDates: holidaysIn(waters.opensOn, waters.closesOn), caseOrFrame: "Lender's frame",
        })),
        approve: true,
      }, registrar, conservator, signal);
      displays += w.displays;
    }
  }
  log(`Demo exhibitions and loans: ${exhibitions} exhibitions, ${displays} display periods, ${made} loans, ${reports} loan condition reports in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
  return { exhibitions, displays, loans: made, reports };
}

