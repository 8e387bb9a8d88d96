// A publication for the editions tests: The Saturday Quadrant of Larkspur & Quill Press
// (our demo scenario), weekly, solutions in the same edition, fees in GBP minor units.
export const quadrantPublication = {
  title: 'The Saturday Quadrant',
  publisher: 'Larkspur & Quill Press',
  templateId: 'newspaper-column',
  cadence: 'weekly',
  solutionRule: 'same_edition',
  reuseWindowDays: 90,
  currency: 'GBP',
  feeAssemblyMinor: 4500,
  feeDeductionMinor: 6000,
} as const;
