import { z } from 'zod';

/**
 * What an instrument export said about itself at upload (read by the engine's
 * `readExportMetadata`), and how the upload treated it. Line numbers are the export's own, from 1.
 */
const StatedTextSchema = z.object({ text: z.string(), line: z.number().int() });

export const DeclaredExportSchema = z.object({
  /** Sample codes of the lab's format found in the file name. */
  fileNameCodes: z.array(z.string()),
  sample: StatedTextSchema.extend({ codes: z.array(z.string()) }).nullable(),
  temperature: StatedTextSchema.extend({
    value: z.number(),
    unit: z.enum(['degC', 'K', 'degF']),
    celsius: z.number(),
  }).nullable(),
  instrument: StatedTextSchema.nullable(),
  measuredAt: StatedTextSchema.extend({ iso: z.string().nullable() }).nullable(),
  /** Statements the reader would not complete by a guess (a temperature without a unit…). */
  notes: z.array(z.object({ line: z.number().int(), message: z.string() })),
  /**
   * `matches`: every code the file names is this sample's; `no-code`: it names none;
   * `other-sample-confirmed`: it names another sample and the analyst kept it with a reason.
   */
  identity: z.enum(['matches', 'no-code', 'other-sample-confirmed']),
  /** Codes the file names that are not this sample's. */
  otherCodes: z.array(z.string()),
  /** Why a file naming another sample was kept (audited). */
  identityReason: z.string().nullable(),
  /** Why a typed temperature was kept over the file's (audited). */
  temperatureReason: z.string().nullable(),
});
export type DeclaredExport = z.infer<typeof DeclaredExportSchema>;

/** `file`: stated by the export; `entered`: typed, the export states none; `entered-over-file`: typed, differing from the export, with a reason. */
export const TemperatureSourceSchema = z.enum(['entered', 'file', 'entered-over-file']);
export type TemperatureSource = z.infer<typeof TemperatureSourceSchema>;

/** What the analyst confirms for one file of an upload, with a reason that is audited. */
export const UploadConfirmationSchema = z.object({
  fileName: z.string().min(1).max(255),
  /** `sample-code`: keep a file that names another sample; `temperature`: keep the typed temperature over the file's. */
  about: z.enum(['sample-code', 'temperature']),
  reason: z.string().trim().min(5, 'give a reason of at least 5 characters').max(1000),
});
export type UploadConfirmation = z.infer<typeof UploadConfirmationSchema>;

/** The multipart `confirmations` field: a JSON array, at most one entry per file and kind. */
export const UploadConfirmationsFieldSchema = z
  .string()
  .max(100_000)
  .transform((text, ctx) => {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'must be a JSON array of { fileName, about, reason }' });
      return z.NEVER;
    }
  })
  .pipe(z.array(UploadConfirmationSchema).max(40));

/** Why a file of an upload was not saved. */
export const FILE_REFUSALS = ['unreadable', 'other-sample', 'temperature-mismatch', 'temperature-missing', 'temperature-out-of-range'] as const;
export const FileRefusalSchema = z.enum(FILE_REFUSALS);
export type FileRefusal = z.infer<typeof FileRefusalSchema>;
