import { QueryTypes } from 'sequelize';
import type { ClimateRoom, ClimateSeries, ClimateSettings, ClimateSummary } from '@toneledger/common/schemas/climate';
import { climateFigures, climatePeriod, type Figures } from '@toneledger/common/domain/climate-figures';
import type { Reading } from '@toneledger/common/domain/climate-readings';
import { db } from '../db';
import { notFound } from '../errors';
import { Location } from '../models';
import { getClimateSettings } from './climate-settings.service';

/** A location's figures, series and the store-room view. The sums are `domain/climate-figures.ts`; this only loads rows. */

const today = () => new Date().toISOString().slice(0, 10);
const MAX_POINTS = 1000;

interface Row { ms: number; t: number; rh: number }
const toReading = (r: Row): Reading => ({ at: Number(r.ms), temperatureC: Number(r.t), rhPercent: Number(r.rh) });

async function figuresOf(locationId: string, start: number, end: number, settings: ClimateSettings): Promise<Figures & { lastReadingAt: string | null }> {
  const rows = await db().query<Row>(
    `SELECT (extract(epoch FROM taken_at) * 1000)::float8 AS ms, temperature_c AS t, rh_percent AS rh FROM climate_readings
     WHERE location_id = $1 AND taken_at >= to_timestamp($2 / 1000.0) AND taken_at < to_timestamp($3 / 1000.0) ORDER BY taken_at`,
    { bind: [locationId, start, end], type: QueryTypes.SELECT },
  );
  const [next] = await db().query<Row>(
    `SELECT (extract(epoch FROM taken_at) * 1000)::float8 AS ms, temperature_c AS t, rh_percent AS rh FROM climate_readings
     WHERE location_id = $1 AND taken_at >= to_timestamp($2 / 1000.0) ORDER BY taken_at LIMIT 1`,
    { bind: [locationId, end], type: QueryTypes.SELECT },
  );
  const readings = rows.map(toReading);
  const f = climateFigures({ readings, next: next ? toReading(next) : null, end, settings });
  return { ...f, lastReadingAt: readings.length ? new Date(readings[readings.length - 1].at).toISOString() : null };
}

function settingsShown(s: ClimateSettings): ClimateSummary['settings'] {
  return {
    target: s.target, targetSource: s.targetSource, reference: s.reference, activationEnergyKjMol: s.activationEnergyKjMol,
    rhExponent: s.rhExponent, permanenceSource: s.permanenceSource,
  };
}

async function locationOf(id: string): Promise<Location> {
  const l = await Location.findByPk(id);
  if (!l) throw notFound('The location');
  return l;
}

export async function climateSummary(locationId: string, q: { from?: string; to?: string }): Promise<ClimateSummary> {
  const loc = await locationOf(locationId);
  const settings = await getClimateSettings();
  const p = climatePeriod(q, today());
  const { lastReadingAt: _l, ...f } = await figuresOf(locationId, p.start, p.end, settings);
  return { locationId, locationLabel: loc.pathLabel, from: p.from, to: p.to, ...f, settings: settingsShown(settings) };
}

export async function climateSeries(locationId: string, q: { from?: string; to?: string }): Promise<ClimateSeries> {
  await locationOf(locationId);
  const p = climatePeriod(q, today());
  const bucketMinutes = Math.max(1, Math.ceil((p.end - p.start) / 60_000 / MAX_POINTS));
  const rows = await db().query<{ at: Date; t: number; tmin: number; tmax: number; rh: number; rhmin: number; rhmax: number }>(
    `SELECT date_bin(make_interval(mins => $4), taken_at, to_timestamp($2 / 1000.0)) AS at,
       avg(temperature_c)::float8 AS t, min(temperature_c)::float8 AS tmin, max(temperature_c)::float8 AS tmax,
       avg(rh_percent)::float8 AS rh, min(rh_percent)::float8 AS rhmin, max(rh_percent)::float8 AS rhmax
     FROM climate_readings WHERE location_id = $1 AND taken_at >= to_timestamp($2 / 1000.0) AND taken_at < to_timestamp($3 / 1000.0)
     GROUP BY 1 ORDER BY 1`,
    { bind: [locationId, p.start, p.end, bucketMinutes], type: QueryTypes.SELECT },
  );
  return {
    locationId, from: p.from, to: p.to, bucketMinutes,
    points: rows.map((r) => ({
      at: new Date(r.at).toISOString(), temperatureC: r.t, temperatureMinC: r.tmin, temperatureMaxC: r.tmax, rhPercent: r.rh, rhMin: r.rhmin, rhMax: r.rhmax,
    })),
  };
}

export async function climateRooms(q: { from?: string; to?: string }): Promise<ClimateRoom[]> {
  const settings = await getClimateSettings();
  const p = climatePeriod(q, today());
  const locations = await db().query<{ id: string; label: string; prints: string; last: Date | null }>(
    `SELECT l.id, l.path_label AS label,
       (WITH RECURSIVE sub AS (SELECT l.id AS id UNION ALL SELECT c.id FROM locations c JOIN sub ON c.parent_id = sub.id)
        SELECT count(*) FROM prints pr WHERE pr.location_id IN (SELECT id FROM sub)) AS prints,
       (SELECT max(taken_at) FROM climate_readings r WHERE r.location_id = l.id) AS last
     FROM locations l WHERE EXISTS (SELECT 1 FROM climate_readings r WHERE r.location_id = l.id) ORDER BY l.path_label`,
    { type: QueryTypes.SELECT },
  );
  const rooms: ClimateRoom[] = [];
  for (const l of locations) {
    const f = await figuresOf(l.id, p.start, p.end, settings);
    rooms.push({
      locationId: l.id, locationLabel: l.label, printCount: Number(l.prints), lastReadingAt: l.last ? new Date(l.last).toISOString() : null,
      readings: f.readings, temperatureMean: f.temperature.mean, rhMean: f.rh.mean, outsideEither: f.outsideEither,
      excursions: f.excursions.filter((e) => !e.brief).length, permanence: f.permanence,
    });
  }
  return rooms;
}
