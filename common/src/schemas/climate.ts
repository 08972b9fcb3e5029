import { z } from 'zod';
import { id, isoDate, isoDateTime } from './primitives';

/**
 * Storage climate: temperature and relative-humidity readings from loggers, loaded per location
 * from CSV files (upload → column mapping and preview → accept; nothing is written to the readings
 * until accepted), and the figures of a location over a period: min/max/mean, time outside the
 * target ranges, excursions, and the relative permanence against a reference climate (isoperms,
 * REFERENCES.md §3). The computations are `domain/climate-*.ts`.
 */

/** The climate settings (administrators): target ranges, the reference climate and the isoperm constants, with their sources. */
export const climateSettingsSchema = z
  .object({
    target: z.object({
      temperatureMinC: z.number().min(-40).max(60),
      temperatureMaxC: z.number().min(-40).max(60),
      rhMinPercent: z.number().min(0).max(100),
      rhMaxPercent: z.number().min(0).max(100),
    }),
    /** Where the target ranges come from, shown beside them. */
    targetSource: z.string().trim().min(1).max(1000),
    /** The climate whose permanence is 1. */
    reference: z.object({ temperatureC: z.number().min(-40).max(60), rhPercent: z.number().min(1).max(100) }),
    /** Activation energy of the deterioration, kJ/mol. */
    activationEnergyKjMol: z.number().min(10).max(300),
    /** Exponent of the humidity factor (RH_ref / RH)^n. */
    rhExponent: z.number().min(0).max(5),
    /** Where the isoperm model and its constants come from, shown beside the figure. */
    permanenceSource: z.string().trim().min(1).max(1000),
    /** An excursion shorter than this is listed but flagged as brief, minutes. */
    briefExcursionMinutes: z.number().int().min(0).max(10_000),
    /** A gap between readings longer than this is a gap in the record (not counted in or out of range), minutes. */
    gapMinutes: z.number().int().min(1).max(100_000),
  })
  .refine((s) => s.target.temperatureMinC < s.target.temperatureMaxC, { path: ['target', 'temperatureMaxC'], message: 'The highest temperature must be above the lowest' })
  .refine((s) => s.target.rhMinPercent < s.target.rhMaxPercent, { path: ['target', 'rhMaxPercent'], message: 'The highest RH must be above the lowest' });
export type ClimateSettings = z.infer<typeof climateSettingsSchema>;

export const TEMPERATURE_UNITS = ['C', 'F'] as const;

/** How the columns of a logger file are read. Columns are named by their header text. */
export const climateMappingSchema = z.object({
  timestampColumn: z.string().min(1).max(200),
  /**
   * How to read a timestamp without an offset: an IANA time zone (e.g. Europe/London, so summer
   * time is followed) or a fixed offset (+01:00). A timestamp that carries its own offset keeps it.
   */
  timeZone: z.string().trim().min(1).max(64),
  /** 'auto' reads ISO 8601 and the usual day-first "DD/MM/YYYY HH:mm[:ss]"; 'month-first' reads "MM/DD/YYYY …". */
  dateOrder: z.enum(['auto', 'day-first', 'month-first']).default('auto'),
  temperatureColumn: z.string().min(1).max(200),
  temperatureUnit: z.enum(TEMPERATURE_UNITS),
  rhColumn: z.string().min(1).max(200),
});
export type ClimateMapping = z.infer<typeof climateMappingSchema>;

export const climateRowProblemSchema = z.object({ row: z.number().int(), column: z.string().nullable(), message: z.string() });

/** A logger file as uploaded: its header, first rows, a suggested mapping, and (once checked) the preview. */
export const climateFileSchema = z.object({
  id,
  locationId: id,
  locationLabel: z.string(),
  fileName: z.string(),
  status: z.enum(['uploaded', 'checked', 'accepted', 'discarded']),
  columns: z.array(z.string()),
  /** The first rows as text, for the mapping step. */
  sample: z.array(z.array(z.string())).max(20),
  rowCount: z.number().int(),
  suggestedMapping: climateMappingSchema.partial(),
  mapping: climateMappingSchema.nullable(),
  /** After a check: rows read well, the first 200 problems (row numbers count the header as row 1), the readings' span, and readings already held for that span. */
  check: z
    .object({
      goodRows: z.number().int(),
      badRows: z.number().int(),
      problems: z.array(climateRowProblemSchema),
      firstAt: isoDateTime.nullable(),
      lastAt: isoDateTime.nullable(),
      /** Readings at timestamps this location already holds: they are kept, not replaced. */
      duplicates: z.number().int(),
      preview: z.array(z.object({ takenAt: isoDateTime, temperatureC: z.number(), rhPercent: z.number() })).max(20),
    })
    .nullable(),
  acceptedRows: z.number().int().nullable(),
  uploadedBy: z.object({ id, name: z.string() }),
  uploadedAt: isoDateTime,
  acceptedAt: isoDateTime.nullable(),
});
export type ClimateFile = z.infer<typeof climateFileSchema>;

export const climateCheckInputSchema = z.object({ mapping: climateMappingSchema });

/** A period asked of a location; the last 365 days to today when left out. */
export const climatePeriodQuerySchema = z
  .object({ from: isoDate.optional(), to: isoDate.optional() })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'The end must not be before the start' });

export const excursionSchema = z.object({
  /** What left its range: temperature or RH, above or below. */
  quantity: z.enum(['temperature', 'rh']),
  direction: z.enum(['above', 'below']),
  start: isoDateTime,
  end: isoDateTime,
  minutes: z.number(),
  /** The furthest value reached (°C or %RH). */
  peak: z.number(),
  brief: z.boolean(),
});
export type Excursion = z.infer<typeof excursionSchema>;

const rangeStats = z.object({ min: z.number().nullable(), max: z.number().nullable(), mean: z.number().nullable() });

/** The figures of one location over a period. */
export const climateSummarySchema = z.object({
  locationId: id,
  locationLabel: z.string(),
  from: isoDate,
  to: isoDate,
  readings: z.number().int(),
  /** Minutes covered by readings (gaps longer than the setting left out). */
  coveredMinutes: z.number(),
  gaps: z.array(z.object({ start: isoDateTime, end: isoDateTime, minutes: z.number() })),
  temperature: rangeStats,
  rh: rangeStats,
  /** Share of the covered time outside each target range, 0–1. */
  outsideTemperature: z.number().nullable(),
  outsideRh: z.number().nullable(),
  outsideEither: z.number().nullable(),
  excursions: z.array(excursionSchema),
  /** Relative permanence against the reference climate, time-weighted over the covered time (null: no readings). */
  permanence: z.number().nullable(),
  settings: z.object({
    target: climateSettingsSchema.shape.target,
    targetSource: z.string(),
    reference: climateSettingsSchema.shape.reference,
    activationEnergyKjMol: z.number(),
    rhExponent: z.number(),
    permanenceSource: z.string(),
  }),
});
export type ClimateSummary = z.infer<typeof climateSummarySchema>;

/** The series for a chart: readings averaged into at most ~1,000 buckets over the period. */
export const climateSeriesSchema = z.object({
  locationId: id,
  from: isoDate,
  to: isoDate,
  bucketMinutes: z.number(),
  points: z.array(z.object({
    at: isoDateTime,
    temperatureC: z.number(), temperatureMinC: z.number(), temperatureMaxC: z.number(),
    rhPercent: z.number(), rhMin: z.number(), rhMax: z.number(),
  })),
});
export type ClimateSeries = z.infer<typeof climateSeriesSchema>;

/** The store-room view: each location that holds readings, its figures side by side. */
export const climateRoomSchema = z.object({
  locationId: id,
  locationLabel: z.string(),
  printCount: z.number().int(),
  lastReadingAt: isoDateTime.nullable(),
  readings: z.number().int(),
  temperatureMean: z.number().nullable(),
  rhMean: z.number().nullable(),
  outsideEither: z.number().nullable(),
  excursions: z.number().int(),
  permanence: z.number().nullable(),
});
export type ClimateRoom = z.infer<typeof climateRoomSchema>;
