import { z } from 'zod';
import { EmailSchema } from './common-fields';
import { LabStatusSchema } from './labs';

/** The logo's upload limit and kinds (checked by the file's first bytes, not its name). */
export const LAB_LOGO_MAX_BYTES = 512 * 1024;
export const LAB_LOGO_TYPES = ['image/png', 'image/jpeg'] as const;

export const LabLogoSchema = z.object({
  contentType: z.enum(LAB_LOGO_TYPES),
  sizeBytes: z.number().int(),
  widthPx: z.number().int(),
  heightPx: z.number().int(),
  updatedAt: z.iso.datetime(),
});

/** The lab's own profile, printed on its reports. */
export const LabProfileSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  legalName: z.string(),
  address: z.string(),
  accreditationBody: z.string().nullable(),
  accreditationNumber: z.string().nullable(),
  turnaroundTargetDays: z.number().int(),
  /** Where clients write and reply to; '' until set. */
  contactEmail: z.string(),
  contactPhone: z.string(),
  /** Where clients send samples and how (printed in the label pack); '' until set. */
  shippingAddress: z.string(),
  shippingInstructions: z.string(),
  logo: LabLogoSchema.nullable(),
  status: LabStatusSchema,
  updatedAt: z.iso.datetime(),
});

/** Text a person typed: no NUL or other control characters (line breaks and tabs allowed). */
const typed = (schema: z.ZodString) =>
  schema.refine((v) => ![...v].some((c) => { const n = c.charCodeAt(0); return (n < 32 && c !== '\n' && c !== '\r' && c !== '\t') || n === 127; }), 'must not contain control characters');

export const UpdateLabProfileRequestSchema = z
  .object({
    name: typed(z.string().trim().min(2).max(120)),
    legalName: typed(z.string().trim().min(2).max(200)),
    address: typed(z.string().trim().min(5).max(500)),
    accreditationBody: typed(z.string().trim().max(120)).nullable(),
    accreditationNumber: typed(z.string().trim().max(60)).nullable(),
    turnaroundTargetDays: z.number().int().min(1).max(90),
    contactEmail: z.union([z.literal(''), EmailSchema]),
    contactPhone: z
      .string()
      .trim()
      .max(40)
      .regex(/^[0-9+()\-.\s]*(ext\.?\s*[0-9]+)?$/i, 'must be a phone number (digits, spaces, + ( ) - .)'),
    shippingAddress: typed(z.string().trim().max(500)),
    shippingInstructions: typed(z.string().trim().max(2000)),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, 'must change at least one field');

export type LabLogo = z.infer<typeof LabLogoSchema>;
export type LabProfile = z.infer<typeof LabProfileSchema>;
export type UpdateLabProfileRequest = z.infer<typeof UpdateLabProfileRequestSchema>;
