import type {
  Enclosure as EnclosureDto, Location as LocationDto, Maker as MakerDto, Movement as MovementDto, Paper as PaperDto,
  Print as PrintDto, ProcessStep as StepDto, Recipe as RecipeDto, ImportJob,
} from '@toneledger/common/schemas/catalogue';
import { normaliseRecipe, recipeCautions, type Recipe as DomainRecipe } from '@toneledger/common/domain/recipes';
import { parseEdtf } from '@toneledger/common/domain/edtf';
import type { Role } from '@toneledger/common/domain/roles';
import { mayRead } from '@toneledger/common/fields/field';
import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import type { BathRecipe, EnclosureType, ImportJobModel, Location, Maker, Movement, Paper, Print, ProcessStep } from '../models';
import { warningsOf } from '../services/print-derive';
import { OVER_LIGHT_BUDGET_WARNING } from '@toneledger/common/domain/compatibility';

const iso = (d: Date) => d.toISOString();

export function paperLabel(p: Pick<Paper, 'manufacturer' | 'product' | 'surface'>): string {
  return `${p.manufacturer} ${p.product}${p.surface ? `, ${p.surface}` : ''}`;
}

export function presentMaker(m: Maker, printCount = 0): MakerDto {
  return { id: m.id, name: m.name, lifeDates: m.lifeDates, notes: m.notes, printCount, version: m.version };
}

export function presentPaper(p: Paper, printCount = 0): PaperDto {
  const made = p.madeDates ? parseEdtf(p.madeDates) : null;
  return {
    id: p.id, label: paperLabel(p), manufacturer: p.manufacturer, product: p.product, base: p.base, surface: p.surface,
    baseTint: p.baseTint, weight: p.weight, opticalBrighteners: p.opticalBrighteners, madeDates: p.madeDates,
    madeDisplay: made && made.ok ? made.value.display : null, notes: p.notes, printCount, version: p.version,
  };
}

export function toDomainRecipe(r: Pick<BathRecipe, 'name' | 'volumeMl' | 'ingredients'>): DomainRecipe {
  return {
    name: r.name,
    volumeMl: r.volumeMl,
    ingredients: r.ingredients.map((i) => ({ chemical: i.chemical, amount: i.amount, unit: i.unit, strengthPercent: i.strengthPercent ?? null, densityGPerMl: i.densityGPerMl ?? null })),
  };
}

export function presentRecipe(r: BathRecipe, stepCount = 0): RecipeDto {
  const domain = toDomainRecipe(r);
  return {
    id: r.id, name: r.name, tonerClass: r.tonerClass as RecipeDto['tonerClass'], volumeMl: r.volumeMl, ingredients: r.ingredients,
    mixingNotes: r.mixingNotes, normalised: normaliseRecipe(domain), cautions: recipeCautions(domain), stepCount, version: r.version,
  };
}

export function presentLocation(l: Location, printCount = 0): LocationDto {
  const path = l.pathLabel.split(' › ');
  return {
    id: l.id, name: l.name, kind: l.kind as LocationDto['kind'], parentId: l.parentId, code: l.code, notes: l.notes,
    path, pathLabel: l.pathLabel, depth: path.length - 1, printCount, version: l.version,
  };
}

export function presentEnclosure(e: EnclosureType, printCount = 0): EnclosureDto {
  return { id: e.id, name: e.name, material: e.material, alkalineBuffered: e.alkalineBuffered, patResult: e.patResult, notes: e.notes, printCount, version: e.version };
}

export function presentStep(s: ProcessStep & { recipe?: BathRecipe | null }): StepDto {
  return {
    id: s.id, position: s.position, type: s.type as StepDto['type'], agent: s.agent, tonerClass: s.tonerClass as StepDto['tonerClass'],
    recipe: s.recipe ? { id: s.recipe.id, name: s.recipe.name } : null, dilution: s.dilution, timeSeconds: s.timeSeconds,
    temperatureC: s.temperatureC, extent: s.extent as StepDto['extent'], concentration: s.concentration, alkaline: s.alkaline,
    method: s.method as StepDto['method'], value: s.value, unit: s.unit, notes: s.notes,
  };
}

export type LoadedPrint = Print & {
  maker?: Maker | null;
  paper?: Paper | null;
  location?: Location | null;
  enclosure?: EnclosureType | null;
  steps?: (ProcessStep & { recipe?: BathRecipe | null })[];
};

type EnclosureFacts = { name: string; alkalineBuffered: boolean | null; patResult: 'passed' | 'failed' | 'not_tested' };

/** How each kind of reference leaves the server (the output schemas in fields/print.ts). */
const REFERENCES: Record<string, (p: LoadedPrint) => unknown> = {
  maker: (p) => (p.maker ? { id: p.maker.id, name: p.maker.name } : null),
  paper: (p) => (p.paper ? { id: p.paper.id, label: paperLabel(p.paper) } : null),
  location: (p) => (p.location ? { id: p.location.id, pathLabel: p.location.pathLabel } : null),
  enclosure: (p) => (p.enclosure ? { id: p.enclosure.id, name: p.enclosure.name, alkalineBuffered: p.enclosure.alkalineBuffered, patResult: p.enclosure.patResult } : null),
};

/**
 * The full print: every field of the print field table that the role may read (locations and staff
 * notes only for roles with `catalogue.read_restricted`, the valuation only for roles with
 * `valuation.read`), then what the screen
 * needs beside them. A field's value is the model attribute of the same name, unless it is a
 * reference or computed.
 */
export function presentPrint(p: LoadedPrint, role: Role | null): PrintDto {
  const steps = [...(p.steps ?? [])].sort((a, b) => a.position - b.position);
  const enclosure: EnclosureFacts | null = p.enclosure ? { name: p.enclosure.name, alkalineBuffered: p.enclosure.alkalineBuffered, patResult: p.enclosure.patResult } : null;
  const computed: Record<string, () => unknown> = {
    warnings: () => [...warningsOf(p.process, steps, enclosure), ...(p.warningCodes?.includes('over_light_budget') ? [OVER_LIGHT_BUDGET_WARNING] : [])],
    updatedAt: () => iso(p.updatedAt),
  };
  const dto: Record<string, unknown> = {};
  for (const f of PRINT_FIELDS) {
    if (!mayRead(role, f)) continue;
    if (f.type.kind === 'reference') dto[f.key] = REFERENCES[f.type.to](p);
    else if (computed[f.key]) dto[f.key] = computed[f.key]();
    else dto[f.key] = p.get(f.key as keyof Print) ?? null;
  }
  return {
    ...dto,
    dateDisplay: p.dateDisplay, dateEarliest: p.dateEarliest, dateLatest: p.dateLatest,
    steps: steps.map(presentStep),
    version: p.version, createdAt: iso(p.createdAt),
  } as PrintDto;
}

export function presentMovement(m: Movement & { from?: Location | null; to?: Location | null }): MovementDto {
  return {
    id: m.id,
    from: m.from ? { id: m.from.id, pathLabel: m.from.pathLabel } : null,
    to: { id: m.toLocationId, pathLabel: m.to?.pathLabel ?? '' },
    movedAt: iso(m.movedAt), movedBy: m.movedByName, reason: m.reason,
  };
}

/** A job checked before files could carry steps has issues without a `file`: they were all in the prints file. */
export function presentImport(j: ImportJobModel): ImportJob {
  return {
    id: j.id, fileName: j.fileName, stepsFileName: j.stepsFileName ?? null, status: j.status as ImportJob['status'],
    totalRows: j.totalRows, processedRows: j.processedRows, stepRows: j.stepRows ?? 0,
    errorCount: j.errorCount, errors: (j.errors as Omit<ImportJob['errors'][number], 'file'>[]).map((e) => ({ file: 'prints' as const, ...e })), newMakers: j.newMakers,
    toCreate: j.toCreate ?? 0, toUpdate: j.toUpdate ?? 0, unchanged: j.unchangedRows ?? 0, ignoredColumns: j.ignoredColumns ?? [],
    mode: j.mode ?? null, createdPrints: j.createdPrints, updatedPrints: j.updatedPrints ?? 0,
    message: j.message, createdAt: iso(j.createdAt), finishedAt: j.finishedAt ? iso(j.finishedAt) : null,
  };
}
