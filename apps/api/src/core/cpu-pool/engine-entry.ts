// The engine functions the worker tasks load on first use (a relative module, so the compiled
// path aliases resolve as everywhere else).
export { calibrate, createSpectrumIndex, fitModel, impedance, parseSpectrumFile, readExportMetadata, SpectrumImportError } from '@ohmprint/spectral-engine';
