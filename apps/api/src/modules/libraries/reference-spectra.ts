import type { EntityManager } from 'typeorm';
import type { ReferenceSpectra } from '@ohmprint/contracts';
import { publishedLibrary } from './published-library';

/** A published version's lots on its grid, for the reference band on the sample's plots. */
export async function referenceSpectra(manager: EntityManager, labId: string, versionId: string): Promise<ReferenceSpectra> {
  const library = await publishedLibrary(manager, labId, versionId);
  return {
    libraryVersionId: library.versionId,
    productName: library.productName,
    version: library.version,
    impedanceUnit: 'Ω·cm',
    referenceTemperatureC: library.method.referenceTemperatureC,
    temperatureCoefficientPerC: library.method.temperatureCoefficientPerC,
    frequencyHz: Array.from(library.grid),
    lots: library.lots.map((lot, i) => ({ lotId: lot.id, lotCode: lot.lotCode, re: Array.from(library.spectra[i].re), im: Array.from(library.spectra[i].im) })),
  };
}
