import type { EntityManager } from 'typeorm';
import { classicalMds, distanceMatrix, type Calibration, type Spectrum } from '@ohmprint/spectral-engine';
import type { LibraryOverview } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { decodeLotSpectrum } from './lot-spectrum-bytes';

/** Lots drawn on the map; beyond it the map keeps the lots farthest from the rest (the ones worth a look). */
export const MAP_LIMIT = 200;
/** Lots drawn as lines over the band: the few with the largest leave-one-out distances. */
const STANDOUTS = 3;

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * What the library screen draws, kept small whatever the number of lots: the band of the
 * included lots (range and median per grid frequency), the few lots that stand out, and a
 * 2-D map (classical MDS of their distances).
 */
export async function libraryOverview(manager: EntityManager, labId: string, versionId: string): Promise<LibraryOverview> {
  const [v]: { grid_hz: number[]; calibration: Calibration | null }[] = await manager.query(
    `SELECT grid_hz, calibration FROM library_version WHERE id = $1 AND lab_id = $2`,
    [versionId, labId],
  );
  if (!v) throw ApiError.notFound('Library version');
  const grid = Float64Array.from(v.grid_hz);
  const rows: { id: string; lot_code: string; spectrum: Buffer }[] = await manager.query(
    `SELECT id, lot_code, spectrum FROM reference_lot WHERE library_version_id = $1 AND lab_id = $2 AND included ORDER BY lot_code, id`,
    [versionId, labId],
  );
  const spectra: Spectrum[] = rows.map((r) => decodeLotSpectrum(r.spectrum, grid));
  const n = grid.length;
  const empty: LibraryOverview = { impedanceUnit: 'Ω·cm', frequencyHz: Array.from(grid), band: null, standouts: [], map: [], mapLotsLeftOut: 0 };
  if (!spectra.length) return empty;
  const band = { reLow: [], reHigh: [], imLow: [], imHigh: [], modulusLow: [], modulusHigh: [], phaseLowDeg: [], phaseHighDeg: [], reMedian: [], imMedian: [] } as Record<string, number[]>;
  for (let k = 0; k < n; k++) {
    const re = spectra.map((s) => s.re[k]);
    const im = spectra.map((s) => s.im[k]);
    const mod = spectra.map((s) => Math.hypot(s.re[k], s.im[k]));
    const ph = spectra.map((s) => (Math.atan2(s.im[k], s.re[k]) * 180) / Math.PI);
    band.reLow.push(Math.min(...re));
    band.reHigh.push(Math.max(...re));
    band.imLow.push(Math.min(...im));
    band.imHigh.push(Math.max(...im));
    band.modulusLow.push(Math.min(...mod));
    band.modulusHigh.push(Math.max(...mod));
    band.phaseLowDeg.push(Math.min(...ph));
    band.phaseHighDeg.push(Math.max(...ph));
    band.reMedian.push(median(re));
    band.imMedian.push(median(im));
  }
  const calibrated = v.calibration !== null && v.calibration.nearestDistances.length === spectra.length;
  const byDistance = spectra.map((_, i) => i).sort((a, b) => (calibrated ? v.calibration!.nearestDistances[b] - v.calibration!.nearestDistances[a] : a - b));
  const standouts = calibrated ? byDistance.slice(0, STANDOUTS).map((i) => ({ lotCode: rows[i].lot_code, re: Array.from(spectra[i].re), im: Array.from(spectra[i].im) })) : [];
  let map: LibraryOverview['map'] = [];
  const mapped = spectra.length > MAP_LIMIT ? byDistance.slice(0, MAP_LIMIT).sort((a, b) => a - b) : byDistance.slice().sort((a, b) => a - b);
  if (mapped.length >= 3) {
    const mds = classicalMds(distanceMatrix(mapped.map((i) => spectra[i])), 2);
    map = mapped.map((i, k) => ({ lotId: rows[i].id, lotCode: rows[i].lot_code, x: mds.coordinates[k][0], y: mds.coordinates[k][1] }));
  }
  return {
    impedanceUnit: 'Ω·cm',
    frequencyHz: Array.from(grid),
    band: band as unknown as LibraryOverview['band'],
    standouts,
    map,
    mapLotsLeftOut: spectra.length - mapped.length,
  };
}
