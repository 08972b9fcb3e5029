import { QueryTypes, type Transaction } from 'sequelize';
import type { ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { exposureBetween, periodExposure } from '@toneledger/common/domain/light-dose';
import { lightWarnings, type LightCategory } from '@toneledger/common/domain/light-budget';
import { predictDisplayCost } from '@toneledger/common/domain/light-cost';
import { categoryByRules } from '@toneledger/common/domain/light-rules';
import { LIGHT_RESPONSIVITY } from '@toneledger/common/schemas/vocab';
import { Exhibition, ExhibitionVenue } from '../models';
import { db } from '../db';
import { notFound } from '../errors';
import { presentDisplay, presentExhibition } from '../presenters/exhibition.presenter';
import { toCsv } from './csv-cells';
import { loadDisplays, periodOf, todayIso } from './display-rows';
import { getLightSettings } from './light-settings.service';
import { lightCostOf, statusOf } from './light.service';

interface ObjectRow {
  print_id: string;
  accession_number: string;
  title: string;
  process: string;
  toner_classes: string[];
  light_responsivity: LightCategory | null;
  approval: 'pending' | 'approved' | 'refused';
  reason: string | null;
  approved_by: string | null;
  approved_by_name: string | null;
  approved_at: Date | null;
  thumb_image_id: string | null;
}

/**
 * One exhibition with its object list and each object's light figures: its displays here, the
 * lux-hours this exhibition gives it, what is left of its annual budget in the calendar year the
 * exhibition opens once this exhibition is counted with every other display (null: no budget),
 * the ΔE00 its light-cost fit expects this exhibition to add, and the warnings this exhibition
 * raises (brighter than its category's maximum, over its annual budget counted over any 12 months).
 */
export async function exhibitionDetail(id: string, t?: Transaction): Promise<ExhibitionDetail> {
  const e = await Exhibition.findByPk(id, { transaction: t });
  if (!e) throw notFound('The exhibition');
  const venues = await ExhibitionVenue.findAll({ where: { exhibitionId: id }, order: [['position', 'ASC']], transaction: t });
  const objects = await db().query<ObjectRow>(
    `SELECT o.print_id, p.accession_number, p.title, p.process, p.toner_classes, p.light_responsivity, o.approval, o.reason,
            o.approved_by, u.name AS approved_by_name, o.approved_at,
            (SELECT i.id FROM images i WHERE i.print_id = p.id AND i.withdrawn_at IS NULL AND i.thumb_key IS NOT NULL
              ORDER BY i.captured_on NULLS LAST, i.uploaded_at LIMIT 1) AS thumb_image_id
       FROM exhibition_objects o JOIN prints p ON p.id = o.print_id LEFT JOIN users u ON u.id = o.approved_by
      WHERE o.exhibition_id = $1 ORDER BY p.accession_sort`,
    { bind: [id], transaction: t, type: QueryTypes.SELECT },
  );
  const base = presentExhibition(e, venues, objects.length);
  const settings = await getLightSettings(t);
  const all = objects.length ? await loadDisplays({ printIds: objects.map((o) => o.print_id) }, t) : [];
  const asOf = todayIso();
  const year = (base.opensOn || asOf).slice(0, 4);
  const out: ExhibitionDetail['objects'] = [];
  for (const o of objects) {
    const mine = all.filter((d) => d.print_id === o.print_id && d.exhibition_id === id);
    const others = all.filter((d) => d.print_id === o.print_id && d.exhibition_id !== id);
    const category = o.light_responsivity ?? categoryByRules(settings, o.process, o.toner_classes);
    const budget = settings.budgets[category];
    const planned = mine.map(periodOf);
    const luxHours = planned.reduce((s, p) => s + periodExposure(p), 0);
    const every = [...others.map(periodOf), ...planned];
    const status = statusOf(others.map(periodOf), category, settings, asOf, planned);
    const warnings = planned.length
      ? lightWarnings({ ...status, luxOverMax: status.luxOverMax.filter((x) => x.planned) })
        .filter((w) => w.code === 'planned_exceeds_budget' || w.code === 'over_max_lux')
      : [];
    let expectedDeltaE00: number | null = null;
    if (planned.length) {
      const cost = await lightCostOf(o.print_id, every, t);
      if (cost.result.status === 'ok') expectedDeltaE00 = predictDisplayCost(cost.result, luxHours, cost.currentDeltaE ?? 0, cost.threshold).addedDeltaE;
    }
    out.push({
      printId: o.print_id, accessionNumber: o.accession_number, printTitle: o.title,
      thumbnailUrl: o.thumb_image_id ? `/api/images/${o.thumb_image_id}/file/thumb` : null,
      lightResponsivity: category,
      approval: o.approval, approvalReason: o.reason,
      approvedBy: o.approved_by ? { id: o.approved_by, name: o.approved_by_name ?? '' } : null,
      approvedAt: o.approved_at ? new Date(o.approved_at).toISOString() : null,
      displays: mine.map(presentDisplay),
      luxHours,
      budgetLeftLuxHours: budget.annualLuxHours === null ? null : budget.annualLuxHours - exposureBetween(every, `${year}-01-01`, `${year}-12-31`),
      expectedDeltaE00,
      warnings: warnings.map((w) => ({ code: w.code, message: w.message })),
    });
  }
  return { ...base, objects: out };
}

const CSV_HEADER = [
  'accession_number', 'title', 'light_responsivity', 'approval', 'approval_reason', 'venue', 'starts_on', 'ends_on', 'lux', 'hours_per_day',
  'days_open', 'closed_dates', 'uv_microwatts_per_lumen', 'case_or_frame', 'mount_notes', 'period_lux_hours', 'exhibition_lux_hours',
  'budget_left_lux_hours', 'expected_delta_e00', 'warnings',
];

/** The object list as CSV: one row per display period, and one for an object without any. */
export async function exhibitionChecklistCsv(id: string): Promise<{ title: string; csv: string }> {
  const d = await exhibitionDetail(id);
  const rows: (string | number | null)[][] = [CSV_HEADER];
  for (const o of d.objects) {
    const common = [o.accessionNumber, o.printTitle, LIGHT_RESPONSIVITY.labels[o.lightResponsivity as LightCategory] ?? o.lightResponsivity, o.approval, o.approvalReason];
    const tail = [o.luxHours, o.budgetLeftLuxHours, o.expectedDeltaE00 === null ? null : Number(o.expectedDeltaE00.toFixed(2)), o.warnings.map((w) => w.message).join(' | ')];
    if (!o.displays.length) rows.push([...common, ...Array(11).fill(null), ...tail]);
    for (const p of o.displays) {
      rows.push([
        ...common, p.venueName, p.startsOn, p.endsOn, p.lux, p.hoursPerDay, p.daysOpen.join(';'), p.closedDates.join(';'),
        p.uvMicrowattsPerLumen, p.caseOrFrame, p.mountNotes, p.luxHours, ...tail,
      ]);
    }
  }
  return { title: d.title, csv: toCsv(rows) };
}
