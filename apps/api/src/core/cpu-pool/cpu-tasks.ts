/**
 * The CPU-heavy work of the API, run in worker threads by the pool in `cpu-pool.ts`. Every task is
 * a pure function of its (structured-clonable) input: no database, no configuration, no state
 * kept between calls, so any worker can run any task and a result depends on nothing else.
 * Heavy modules (PDF, engine) load on a thread's first task that needs them, so a thread that only
 * hashes passwords starts quickly.
 */
import { performance } from 'node:perf_hooks';
import { threadId } from 'node:worker_threads';
import bcrypt from 'bcryptjs';
import { move, transferableSymbol, valueSymbol } from 'piscina';
import type { calibrate, ExportMetadata, FitResult, ModelReference, Spectrum } from '@ohmprint/spectral-engine';
import type { FieldError, KramersKronigSummary } from '@ohmprint/contracts';
import type { ComputedAnalysis } from '../../modules/analyses/compute-analysis';
import type { OtherLibrary } from '../../modules/analyses/does-not-belong';
import type { LibraryHandOver } from '../../modules/libraries/library-packing';
import type { PublishedLibrary } from '../../modules/libraries/published-library';
import type { Replicate } from '../../modules/measurements/replicate.entity';
import type { LabelPackData } from '../../modules/orders/label-pack-data';
import type { ReportData } from '../../modules/reports/pdf/report-data';
import type { CredentialDetails } from '../../modules/reports/signing/credential-details';
import type { ValidationSummaryData } from '../../modules/validation/validation-pdf';
import type { SignatureFields } from '../../modules/reports/signing/sign-pdf';
import { ApiError } from '../api-error';

/**
 * A module loaded on first use. Plain `require` (not `import()`): the same call works compiled
 * to CommonJS and under the TypeScript loader the test threads use.
 */
// eslint-disable-next-line @typescript-eslint/no-require-imports
const load = <T>(id: string): T => require(id) as T;

/** An ApiError thrown in a worker, carried back as data (class identity does not cross threads). */
export interface TaskRefusal {
  refused: { status: number; title: string; detail?: string; type: string; errors?: FieldError[]; headers?: Record<string, string>; extensions?: ApiError['extensions'] };
}

function refusalOf(err: unknown): TaskRefusal {
  if (err instanceof ApiError) {
    const { status, title, detail, errors, headers, extensions } = err;
    return { refused: { status, title, detail, type: err.type.replace(/^urn:ohmprint:problem:/, ''), errors, headers, extensions } };
  }
  throw err;
}

export function hashPassword(input: { password: string; cost: number }): string {
  return bcrypt.hashSync(input.password, input.cost);
}

export function verifyPassword(input: { password: string; hash: string }): boolean {
  return bcrypt.compareSync(input.password, input.hash);
}

export interface ExportFile {
  name: string;
  /** The export as uploaded, in the upload's private temporary folder. */
  path: string;
}

export type ParsedExport =
  | { name: string; ok: true; kramersKronig: KramersKronigSummary; literals: SpectrumLiterals; metadata: ExportMetadata; points: number }
  | { name: string; ok: false; line: number | null; column: number | null; message: string };

/**
 * The spectrum's three columns as PostgreSQL array literals, written here so the event loop does
 * not turn 100,000 numbers into text while it stores an upload. `String(number)` is the shortest
 * text that reads back as the same double, as the driver would write it.
 */
export interface SpectrumLiterals {
  frequencyHz: string;
  re: string;
  im: string;
}
const arrayLiteral = (values: Float64Array): string => `{${Array.prototype.join.call(values, ',')}}`;

/**
 * Reads one instrument export from its temporary file, parses it, runs its Kramers–Kronig check
 * and reads what the file says about itself (sample code, temperature; `codePattern` is the lab's
 * sample-code format as RegExp source). The file's bytes and text never reach the event loop: only
 * the column text and the small summaries go back. A bad file is an answer (line, column), not an error.
 */
export async function parseExportFile(input: { file: ExportFile; maxPoints: number; kkLimitPercent: number; codePattern: string }): Promise<ParsedExport> {
  const { parseSpectrumFile, SpectrumImportError, readExportMetadata } = load<typeof import('./engine-entry')>('./engine-entry');
  const { kramersKronigCheck } = load<typeof import('../../modules/measurements/kramers-kronig-check')>('../../modules/measurements/kramers-kronig-check');
  const { readFileSync } = load<typeof import('node:fs')>('node:fs');
  const { file } = input;
  let text: string | null = new TextDecoder('utf-8').decode(readFileSync(file.path));
  try {
    const spectrum = parseSpectrumFile(text, { maxPoints: input.maxPoints });
    const metadata = readExportMetadata(file.name, text, { codePattern: new RegExp(input.codePattern) });
    text = null;
    const literals = { frequencyHz: arrayLiteral(spectrum.frequencyHz), re: arrayLiteral(spectrum.re), im: arrayLiteral(spectrum.im) };
    return { name: file.name, ok: true, kramersKronig: kramersKronigCheck(spectrum, input.kkLimitPercent), literals, metadata, points: spectrum.frequencyHz.length };
  } catch (err) {
    if (!(err instanceof SpectrumImportError)) throw err;
    return { name: file.name, ok: false, line: err.line ?? null, column: err.column ?? null, message: err.message };
  }
}

/** A KCl standard run's file as read in a worker: the standard's resistance, the columns as array text, and the file's bytes to store. */
export interface StandardRunReading {
  resistanceOhm: number;
  source: 'plateau' | 'fit';
  how: string;
  literals: SpectrumLiterals;
  /** The file as uploaded, moved rather than copied. */
  bytes: Uint8Array;
}

/**
 * Reads a KCl standard run from its temporary file, parses it and finds the standard's resistance
 * (its plateau, or R of an R + CPE fit), so neither the parse nor the fit runs on the event loop.
 * A file that cannot be read, or has no plateau and no usable fit, is refused (400 naming `file`).
 */
export async function readStandardRun(input: { file: ExportFile }): Promise<StandardRunReading | TaskRefusal> {
  const { parseSpectrumFile, SpectrumImportError } = load<typeof import('./engine-entry')>('./engine-entry');
  const { standardResistance } = load<typeof import('../../modules/validation/standard-resistance')>('../../modules/validation/standard-resistance');
  const { readFileSync } = load<typeof import('node:fs')>('node:fs');
  const { file } = input;
  try {
    const content = readFileSync(file.path);
    let spectrum: Spectrum;
    try {
      spectrum = parseSpectrumFile(content.toString('utf8'));
    } catch (err) {
      if (!(err instanceof SpectrumImportError)) throw err;
      throw ApiError.badRequest(`${file.name}: ${err.message}`, [{ field: 'file', message: `${file.name}: ${err.message}` }]);
    }
    const bytes = ownBytes(content);
    const reading: StandardRunReading = {
      ...standardResistance(spectrum),
      literals: { frequencyHz: arrayLiteral(spectrum.frequencyHz), re: arrayLiteral(spectrum.re), im: arrayLiteral(spectrum.im) },
      bytes,
    };
    return withTransfers(reading, [bytes.buffer as ArrayBuffer]);
  } catch (err) {
    return refusalOf(err);
  }
}

/** An analysis as it comes back from a worker: the small result, and every lot's distance packed and transferred. */
export interface AnalysedInWorker {
  result: ComputedAnalysis['result'];
  sampleSpectrum: ComputedAnalysis['sampleSpectrum'];
  lotCount: number;
  /** Every lot's distance nearest first, as stored (`encodeRanked`), moved rather than copied. */
  rankedBytes: Uint8Array;
  /** Every lot's distance in the version's lot order, only when asked (`lotOrder`; reproduce compares them). */
  lotDistances: Float64Array | null;
  /** This thread's stages in milliseconds. */
  workerMs: Record<string, number>;
}

/** The libraries a reference named that this thread does not keep: the caller sends them whole. */
export interface MissingLibraries {
  missing: string[];
}

/**
 * Scores the sample against its library and looks at the lab's other libraries. Each library
 * arrives whole (then kept, up to `keepBytes` in all) or as a reference to one this thread keeps;
 * a reference to one it lacks answers `{ missing }` without computing anything.
 */
export async function analyse(input: {
  replicates: Replicate[];
  library: LibraryHandOver;
  others?: (Omit<OtherLibrary, 'library'> & { library: LibraryHandOver })[];
  keepBytes?: number;
  lotOrder?: boolean;
}): Promise<AnalysedInWorker | MissingLibraries | TaskRefusal> {
  const { computeAnalysis } = load<typeof import('../../modules/analyses/compute-analysis')>('../../modules/analyses/compute-analysis');
  const { receiveLibrary } = load<typeof import('../../modules/libraries/library-packing')>('../../modules/libraries/library-packing');
  try {
    const { encodeRanked } = load<typeof import('../../modules/analyses/lot-distances')>('../../modules/analyses/lot-distances');
    const t0 = performance.now();
    const library = receiveLibrary(input.library, input.keepBytes);
    const others = (input.others ?? []).map((o) => ({ ...o, library: receiveLibrary(o.library, input.keepBytes) }));
    const missing = [input.library, ...(input.others ?? []).map((o) => o.library)].filter((_, i) => (i === 0 ? library : others[i - 1].library) === null).map((h) => h.versionId);
    if (missing.length) return { missing };
    const t1 = performance.now();
    const inside: Record<string, number> = {};
    const computed = computeAnalysis(input.replicates, library as PublishedLibrary, others as OtherLibrary[], inside);
    const t2 = performance.now();
    // Every lot's distance packed for storage here, so the request thread only hands the bytes on.
    const ranked = encodeRanked(computed.ranking, computed.lotDistances);
    const rankedBytes = ownBytes(ranked);
    const lotDistances = input.lotOrder ? computed.lotDistances : null;
    const t3 = performance.now();
    const answer: AnalysedInWorker = {
      result: computed.result,
      sampleSpectrum: computed.sampleSpectrum,
      lotCount: computed.lotDistances.length,
      rankedBytes,
      lotDistances,
      workerMs: { receive: t1 - t0, compute: t2 - t1, ...Object.fromEntries(Object.entries(inside).map(([k, ms]) => [`compute-${k}`, ms])), encode: t3 - t2 },
    };
    return withTransfers(answer, [rankedBytes.buffer as ArrayBuffer, ...(lotDistances ? [lotDistances.buffer as ArrayBuffer] : [])]);
  } catch (err) {
    return refusalOf(err);
  }
}

/**
 * A published library's spectra as they came from the database (float64 little-endian, lot after
 * lot), read into one shared array the request thread and every worker use in place. The bytes
 * arrive by transfer; on a little-endian machine reading them is one copy.
 */
export async function decodeLibrarySpectra(input: { bytes: Uint8Array; values: number }): Promise<Float64Array> {
  const { bytes, values } = input;
  if (bytes.byteLength !== 8 * values) throw new RangeError(`${values} spectrum values need ${8 * values} bytes, not ${bytes.byteLength}`);
  const out = new Float64Array(new SharedArrayBuffer(Math.max(8, 8 * values))).subarray(0, values);
  if (LITTLE_ENDIAN && bytes.byteOffset % 8 === 0) out.set(new Float64Array(bytes.buffer, bytes.byteOffset, values));
  else {
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    for (let i = 0; i < values; i++) out[i] = view.getFloat64(8 * i, true);
  }
  return out;
}
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** `value` posted back with `buffers` moved rather than copied (they must be its own, unshared). */
function withTransfers<T extends object>(value: T, buffers: ArrayBuffer[]): T {
  const transferable = {
    get [transferableSymbol]() {
      return buffers;
    },
    get [valueSymbol]() {
      return value;
    },
  };
  return move(transferable as unknown as ArrayBuffer) as unknown as T;
}

/** How often a calibration reports its progress on `progress` (and once when the comparison is done). */
export const CALIBRATION_PROGRESS_MS = 200;

/**
 * Calibrates a library. With a `progress` port (transferred with the task), the number of lots
 * compared so far is posted on it as `{ lotsDone, lotCount }` at most every CALIBRATION_PROGRESS_MS
 * while the comparison runs, and once when it is complete; the port is closed at the end.
 */
export async function calibrateLibrary(input: { args: Parameters<typeof calibrate>; progress?: import('node:worker_threads').MessagePort }): Promise<ReturnType<typeof calibrate>> {
  const engine = load<typeof import('./engine-entry')>('./engine-entry');
  const [library, options] = input.args;
  const port = input.progress;
  if (!port) return engine.calibrate(library, options);
  let last = 0;
  const onProgress = (lotsDone: number, lotCount: number) => {
    const now = Date.now();
    if (lotsDone < lotCount && now - last < CALIBRATION_PROGRESS_MS) return;
    last = now;
    port.postMessage({ lotsDone, lotCount });
  };
  try {
    return engine.calibrate(library, { ...options, onProgress });
  } finally {
    port.close();
  }
}

/** Renders the report and signs it; the bytes come back as a Uint8Array (a transferable copy). */
/** The signed report, with the milliseconds its rendering and its signing took in this thread. */
export async function renderAndSign(input: { data: ReportData; logo?: Uint8Array | null; p12: Uint8Array; passphrase: string; signature: SignatureFields }): Promise<{ pdf: Uint8Array; renderMs: number; signMs: number }> {
  const { renderReportPdf } = load<typeof import('../../modules/reports/pdf/render-report-pdf')>('../../modules/reports/pdf/render-report-pdf');
  const { signPdf } = load<typeof import('../../modules/reports/signing/sign-pdf')>('../../modules/reports/signing/sign-pdf');
  const t0 = performance.now();
  const unsigned = await renderReportPdf(input.data, { logo: input.logo ? Buffer.from(input.logo) : null });
  const t1 = performance.now();
  const signed = await signPdf(unsigned, Buffer.from(input.p12), input.passphrase, input.signature);
  return { pdf: new Uint8Array(signed.buffer, signed.byteOffset, signed.byteLength), renderMs: t1 - t0, signMs: performance.now() - t1 };
}

/**
 * How many demo reports a thread renders to warm up. The first render parses the fonts and lays out
 * the report's usual words; V8 then optimises the layout code only after a dozen or so documents:
 * measured on the two-core machine, renders two to ten took 45-77 ms and from about the fifteenth
 * on 24-30 ms. Fifteen renders cost a thread about a second of CPU once, at worker start.
 */
const WARM_UP_RENDERS = 15;

/**
 * Loads the report renderer and signer in this thread and renders the invented demo report
 * WARM_UP_RENDERS times, each under another number and time (numbers and dates are what varies
 * between real reports), so the first real reports render at full speed (a job worker asks each
 * thread at start). Returns the thread's id.
 */
export async function warmReportRenderer(): Promise<number> {
  const { renderReportPdf } = load<typeof import('../../modules/reports/pdf/render-report-pdf')>('../../modules/reports/pdf/render-report-pdf');
  load<typeof import('../../modules/reports/signing/sign-pdf')>('../../modules/reports/signing/sign-pdf');
  const { demoReportData } = load<typeof import('../../modules/reports/pdf/demo-report-content')>('../../modules/reports/pdf/demo-report-content');
  const demo = demoReportData();
  for (let i = 0; i < WARM_UP_RENDERS; i++) {
    const issuedAt = new Date(Date.parse(demo.issuedAt) + i * 7_261_000).toISOString();
    await renderReportPdf({ ...demo, reportNumber: `${demo.reportNumber.slice(0, -3)}${String(900 + i)}`, issuedAt });
  }
  return threadId;
}

export async function selfSignedCredential(input: { labName: string; passphrase: string }): Promise<Uint8Array> {
  const { createSelfSignedCredential } = load<typeof import('../../modules/reports/signing/self-signed-credential')>('../../modules/reports/signing/self-signed-credential');
  const p12 = createSelfSignedCredential(input);
  return new Uint8Array(p12.buffer, p12.byteOffset, p12.byteLength);
}

/**
 * Bytes made in a worker, handed back by transfer rather than by copy. A Buffer that shares
 * Node's small-allocation pool is copied first, since transferring would detach the whole pool.
 */
export function transferredBytes(bytes: Buffer | Uint8Array): Uint8Array {
  return move(ownBytes(bytes)) as unknown as Uint8Array;
}

/** The bytes as a Uint8Array over a buffer of their own, which may be transferred (copied first when they share one). */
function ownBytes(bytes: Uint8Array): Uint8Array {
  return bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength ? new Uint8Array(bytes.buffer, 0, bytes.byteLength) : Uint8Array.prototype.slice.call(bytes);
}
const pdfBytes = transferredBytes;

/** The order's printable label pack (shipping sheet, labels with vector QR codes, custody form). */
export async function labelPack(input: { data: LabelPackData }): Promise<Uint8Array> {
  const { renderLabelPack } = load<typeof import('../../modules/orders/label-pack')>('../../modules/orders/label-pack');
  return pdfBytes(await renderLabelPack(input.data));
}

/** The lab's method-validation summary PDF. */
export async function validationSummary(input: { data: ValidationSummaryData }): Promise<Uint8Array> {
  const { renderValidationSummary } = load<typeof import('../../modules/validation/validation-pdf')>('../../modules/validation/validation-pdf');
  return pdfBytes(await renderValidationSummary(input.data));
}

/** Each lot's spectrum fitted under the method's model (one restart, as the correlation study caches them). */
export async function fitLots(input: { spectra: Spectrum[]; model: ModelReference }): Promise<{ parameters: Record<string, number> | null; reason: string | null }[]> {
  const { fitModel } = load<typeof import('./engine-entry')>('./engine-entry');
  return input.spectra.map((s) => {
    const fit = fitModel(s, input.model, { restarts: 1 });
    return fit.converged ? { parameters: fit.parameters, reason: null } : { parameters: null, reason: fit.reason };
  });
}

/** The method preview's fit of one prepared spectrum, with the fitted curve on its frequencies. */
export async function previewFit(input: { spectrum: Spectrum; model: ModelReference; restarts: number }): Promise<{ fit: FitResult; fitted: { re: Float64Array; im: Float64Array } | null }> {
  const { fitModel, impedance } = load<typeof import('./engine-entry')>('./engine-entry');
  const fit = fitModel(input.spectrum, input.model, { restarts: input.restarts });
  return { fit, fitted: fit.converged ? impedance(input.model, fit.parameters, input.spectrum.frequencyHz) : null };
}

/**
 * Opens a PKCS#12 file (its key derivation can take seconds by design) and describes it; a file
 * that cannot be used comes back as `{ credentialError }` with the reason for the uploader.
 */
export async function openCredential(input: { p12: Uint8Array; passphrase: string; now: Date }): Promise<CredentialDetails | { credentialError: string }> {
  const { readCredential, CredentialError } = load<typeof import('../../modules/reports/signing/credential-details')>('../../modules/reports/signing/credential-details');
  try {
    return readCredential(Buffer.from(input.p12.buffer, input.p12.byteOffset, input.p12.byteLength), input.passphrase, input.now);
  } catch (err) {
    if (err instanceof CredentialError) return { credentialError: err.message };
    throw err;
  }
}

/** For every spectrum, the nearest other one (index and distance) through a packed search index; null when alone. */
export async function nearestOthers(input: { spectra: Spectrum[] }): Promise<({ index: number; distance: number } | null)[]> {
  const { createSpectrumIndex } = load<typeof import('./engine-entry')>('./engine-entry');
  const index = createSpectrumIndex(input.spectra);
  return input.spectra.map((s, i) => {
    const hit = index.nearest(s, 2).find((h) => h.index !== i);
    return hit ? { index: hit.index, distance: hit.distance } : null;
  });
}

/** The repeatability study's distances: replicates within each sample, and between the version's lots. */
export async function repeatabilityDistances(input: Parameters<typeof import('../../modules/validation/repeatability').repeatabilityDistances>[0]): Promise<ReturnType<typeof import('../../modules/validation/repeatability').repeatabilityDistances>> {
  const { repeatabilityDistances: distances } = load<typeof import('../../modules/validation/repeatability')>('../../modules/validation/repeatability');
  return distances(input);
}
