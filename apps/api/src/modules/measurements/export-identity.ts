import type { ExportMetadata } from '@ohmprint/spectral-engine';
import { type DeclaredExport, type RejectedFile, type TemperatureSource, type UploadConfirmation } from '@ohmprint/contracts';

/** The form's limits on a typed temperature apply to a file's too: outside them it is not a liquid on the bench. */
const TEMPERATURE_RANGE_C = { min: -10, max: 90 } as const;

export interface AcceptedExport {
  declared: DeclaredExport;
  temperatureC: number;
  temperatureSource: TemperatureSource;
  /** The confirmations this file used, for the audit log. */
  confirmed: UploadConfirmation[];
}

export type ExportCheck = { ok: true; value: AcceptedExport } | { ok: false; refusal: RejectedFile };

export interface ExportCheckInput {
  sampleCode: string;
  fileName: string;
  /** What the file says about itself (the engine's `readExportMetadata`, run in the worker with the lab's code pattern). */
  metadata: ExportMetadata;
  /** The typed temperature, °C, if any. */
  enteredTemperatureC: number | undefined;
  /** The method's `temperatureMismatchLimitC`. */
  mismatchLimitC: number;
  confirmations: readonly UploadConfirmation[];
}

const formatC = (c: number) => `${Number(c.toFixed(2))} °C`;

/**
 * What one export says about itself, checked against the sample it is uploaded to: a file that
 * names another sample's code is refused unless confirmed with a reason; the temperature the file
 * states is the measurement temperature, and a typed one that differs by more than the method's
 * limit needs a reason too. A file that names no code is accepted as it is.
 */
export function checkExportIdentity(input: ExportCheckInput): ExportCheck {
  const { sampleCode, fileName } = input;
  const read = input.metadata;
  const confirmation = (about: UploadConfirmation['about']) => input.confirmations.find((c) => c.fileName === fileName && c.about === about);
  const refuse = (problem: RejectedFile['problem'], message: string, extra: Partial<RejectedFile> = {}): ExportCheck => ({
    ok: false,
    refusal: { fileName, line: null, column: null, message: `${fileName}: ${message}`, problem, namedCode: null, fileTemperatureC: read.temperature?.celsius ?? null, ...extra },
  });
  const confirmed: UploadConfirmation[] = [];

  const named = [...new Set([...read.fileNameCodes, ...(read.sample?.codes ?? [])])];
  const otherCodes = named.filter((c) => c !== sampleCode);
  const identityConfirmation = otherCodes.length ? confirmation('sample-code') : undefined;
  if (otherCodes.length && !identityConfirmation) {
    const code = otherCodes[0];
    const inLine = read.sample?.codes.includes(code) ? read.sample.line : null;
    const where = inLine ? `line ${inLine} ("${read.sample?.text}")` : 'its file name';
    return refuse('other-sample', `names sample ${code} in ${where}, not ${sampleCode}. Check the file; to keep it anyway, confirm with a reason.`, {
      line: inLine,
      namedCode: code,
    });
  }
  if (identityConfirmation) confirmed.push(identityConfirmation);

  let temperatureC: number;
  let temperatureSource: TemperatureSource;
  let temperatureReason: string | null = null;
  const stated = read.temperature;
  if (stated) {
    if (stated.celsius < TEMPERATURE_RANGE_C.min || stated.celsius > TEMPERATURE_RANGE_C.max) {
      return refuse('temperature-out-of-range', `line ${stated.line} states ${stated.text} (${formatC(stated.celsius)}), outside ${TEMPERATURE_RANGE_C.min}…${TEMPERATURE_RANGE_C.max} °C.`, { line: stated.line });
    }
    const entered = input.enteredTemperatureC;
    if (entered === undefined || Math.abs(entered - stated.celsius) <= input.mismatchLimitC) {
      temperatureC = stated.celsius;
      temperatureSource = 'file';
    } else {
      const reason = confirmation('temperature');
      if (!reason) {
        return refuse(
          'temperature-mismatch',
          `line ${stated.line} states ${formatC(stated.celsius)}, but ${formatC(entered)} was entered (more than ${formatC(input.mismatchLimitC)} apart). Leave the temperature empty to use the file's, or confirm the entered one with a reason.`,
          { line: stated.line },
        );
      }
      confirmed.push(reason);
      temperatureC = entered;
      temperatureSource = 'entered-over-file';
      temperatureReason = reason.reason;
    }
  } else if (input.enteredTemperatureC === undefined) {
    return refuse('temperature-missing', 'states no measurement temperature; enter the sample temperature.');
  } else {
    temperatureC = input.enteredTemperatureC;
    temperatureSource = 'entered';
  }

  return {
    ok: true,
    value: {
      declared: {
        fileNameCodes: read.fileNameCodes,
        sample: read.sample,
        temperature: read.temperature,
        instrument: read.instrument,
        measuredAt: read.measuredAt,
        notes: read.notes,
        identity: otherCodes.length ? 'other-sample-confirmed' : named.length ? 'matches' : 'no-code',
        otherCodes,
        identityReason: identityConfirmation?.reason ?? null,
        temperatureReason,
      },
      temperatureC,
      temperatureSource,
      confirmed,
    },
  };
}
