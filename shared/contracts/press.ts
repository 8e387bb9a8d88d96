import { z } from 'zod';

// The press spec of a publication: which PDF/X standard its print plant takes, the
// characterized output condition it prints to, the bleed and the smallest type size and
// line weight it accepts. The page template supplies the defaults; the publication may
// override each field (null = the template's value). The preflight reads the spec.

export const pressStandards = ['pdfx-1a', 'pdfx-4'] as const;
export const pressStandardSchema = z.enum(pressStandards, { error: `standard must be one of ${pressStandards.join(', ')}` });
export type PressStandard = z.infer<typeof pressStandardSchema>;

/** The standard's name as the file declares it (GTS_PDFXVersion) and the PDF version it is built on. */
export const pressStandardInfo: Record<PressStandard, { label: string; gtsVersion: string; pdfVersion: '1.4' | '1.6'; needsProfile: boolean }> = {
  // ISO 15930-4:2003 (PDF/X-1a:2003, on PDF 1.4): CMYK and spot only, no transparency; the
  // output intent may name a registered characterization instead of embedding a profile.
  'pdfx-1a': { label: 'PDF/X-1a:2003 (CMYK and spot colours only)', gtsVersion: 'PDF/X-1a:2003', pdfVersion: '1.4', needsProfile: false },
  // ISO 15930-7:2010 (PDF/X-4, on PDF 1.6): the output intent must embed its ICC profile.
  'pdfx-4': { label: 'PDF/X-4 (needs the plant\'s ICC output profile)', gtsVersion: 'PDF/X-4', pdfVersion: '1.6', needsProfile: true },
};

/**
 * Characterized printing conditions by their reference names in the ICC's characterization
 * data registry (registry name http://www.color.org). Names and descriptions from memory of
 * the registry and ISO 12647; a plant states which one it prints to.
 */
export const outputConditions = {
  FOGRA39: 'Offset printing on coated paper (ISO 12647-2:2004/Amd 1, paper types 1 and 2), FOGRA39',
  FOGRA51: 'Offset printing on premium coated paper (ISO 12647-2:2013, PS1), FOGRA51',
  FOGRA52: 'Offset printing on wood-free uncoated paper (ISO 12647-2:2013, PS5), FOGRA52',
  IFRA26: 'Coldset offset printing on standard newsprint (ISO 12647-3:2004), IFRA26',
  IFRA30: 'Coldset offset printing on standard newsprint (ISO 12647-3:2013), IFRA30',
  'CGATS TR 001': 'Web offset on coated publication paper (SWOP, ANSI CGATS.6), CGATS TR 001',
  'CGATS TR 006': 'Sheet-fed offset on coated paper (GRACoL), CGATS TR 006',
} as const;
export type OutputConditionId = keyof typeof outputConditions;
const outputConditionIds = Object.keys(outputConditions) as [OutputConditionId, ...OutputConditionId[]];
export const outputConditionSchema = z.enum(outputConditionIds, { error: `output condition must be one of ${outputConditionIds.join(', ')}` });
export const OUTPUT_CONDITION_REGISTRY = 'http://www.color.org';

/** Hairlines thinner than a quarter point may not print (common practice). */
export const HAIRLINE_PT = 0.25;

/** The template's press defaults (templates/pages/*.json, `press`); every field optional there. */
export const templatePressSchema = z
  .object({
    standard: pressStandardSchema.optional(),
    condition: outputConditionSchema.optional(),
    minTypePt: z.number().min(3, 'smallest type size must be at least 3 pt').max(24).optional(),
    minLinePt: z.number().min(0.05, 'thinnest line must be at least 0.05 pt').max(4).optional(),
  })
  .strict();
export type TemplatePress = z.infer<typeof templatePressSchema>;

/** A publication's own choices (null = the template's default). */
export const pressSpecInputSchema = z
  .object({
    standard: pressStandardSchema.nullable(),
    condition: outputConditionSchema.nullable(),
    bleedMm: z.number({ error: 'bleed must be a number of millimetres' }).min(0, 'bleed must not be negative').max(20, 'bleed may be at most 20 mm').nullable(),
    minTypePt: z.number({ error: 'smallest type size must be a number of points' }).min(3, 'smallest type size must be at least 3 pt').max(24, 'smallest type size may be at most 24 pt').nullable(),
    minLinePt: z.number({ error: 'thinnest line must be a number of points' }).min(HAIRLINE_PT, `thinnest line must be at least ${HAIRLINE_PT} pt (hairlines under it may not print)`).max(4).nullable(),
  })
  .strict();
export type PressSpecInput = z.infer<typeof pressSpecInputSchema>;

/** The spec in force: every field resolved. Stored in each proof's print document. */
export const pressSettingsSchema = z.object({
  standard: pressStandardSchema,
  condition: outputConditionSchema,
  bleedMm: z.number(),
  minTypePt: z.number(),
  minLinePt: z.number(),
  /** SHA-256 of the output profile to embed (PDF/X-4), null for none */
  profileSha256: z.string().regex(/^[0-9a-f]{64}$/).nullable(),
});
export type PressSettings = z.infer<typeof pressSettingsSchema>;

/** GET/PUT /api/publications/:id/press-spec: the publication's choices, what is in force, and the profile. */
export const pressSpecResponseSchema = z.object({
  spec: pressSpecInputSchema,
  effective: pressSettingsSchema,
  templateDefaults: pressSettingsSchema.omit({ profileSha256: true }),
  profile: z.object({ sha256: z.string(), description: z.string(), bytes: z.number().int(), uploadedAt: z.string() }).nullable(),
});
export type PressSpecResponse = z.infer<typeof pressSpecResponseSchema>;
