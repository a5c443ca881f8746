import { z } from 'zod';
import { earthingArrangements } from './sites.ts';

/**
 * The job record: everything on an EIC or EICR that is not a schedule of test results, as
 * sections in the order an installation's paperwork follows (BS 7671 Appendix 6 lists what the
 * documents hold; the grouping and the words here are our own).
 *
 * Each section is stored as one JSON document with its own version (`job_sections`). A write
 * sends the version it saw and only the fields it changes; it is refused (409) only when one of
 * *those* fields changed since, so two people can fill different parts of a section at once.
 * Every field has a blank value (empty text, null), so a new job's record is complete in shape
 * and empty in content.
 */

const text = (max: number) => z.string().max(max, `At most ${max} characters.`);
const optionalNumber = (what: string, max: number) =>
  z.number({ error: `${what} must be a number.` }).nonnegative(`${what} cannot be negative.`).max(max, `${what} is at most ${max}.`).nullable();
/** A calendar date as YYYY-MM-DD, or empty. */
export const dateTextSchema = z.union([z.literal(''), z.iso.date({ error: 'Write the date as YYYY-MM-DD.' })]);
const yesNo = z.enum(['yes', 'no']).nullable();
/** Bonding of one kind of extraneous-conductive-part: bonded, not bonded, or nothing of that kind. */
const bondedChoice = z.enum(['yes', 'no', 'none']).nullable();

export const reportReasons = ['periodic', 'sale', 'letting', 'change-of-occupancy', 'insurance', 'alterations-planned', 'other'] as const;
export const premisesKinds = ['domestic', 'rented-dwelling', 'commercial', 'industrial', 'caravan', 'pool-or-similar', 'other'] as const;
export const liveConductorArrangements = [
  '1-phase 2-wire',
  '1-phase 3-wire',
  '2-phase 3-wire',
  '3-phase 3-wire',
  '3-phase 4-wire',
] as const;
export const meansOfEarthing = ['supplier', 'electrode'] as const;
export const conductorMaterials = ['copper', 'aluminium', 'steel', 'other'] as const;

/** Who the work or report is for, and why it was done. */
export const clientSectionSchema = z.object({
  /** The person or company that ordered the work or report. */
  orderedBy: text(200),
  orderedByAddress: text(400),
  /** EICR: why the report was asked for. */
  reason: z.enum(reportReasons).nullable(),
  reasonDetail: text(400),
});

/** The installation as found. */
export const installationSectionSchema = z.object({
  premises: z.enum(premisesKinds).nullable(),
  /** Estimated age of the wiring (years). */
  wiringAgeYears: optionalNumber('The age of the wiring', 200),
  alterationsEvident: z.enum(['yes', 'no', 'unknown']).nullable(),
  /** Estimated age of the alterations (years), when there are some. */
  alterationsAgeYears: optionalNumber('The age of the alterations', 200),
  recordsAvailable: yesNo,
  recordsHeldBy: text(200),
  /** Date of the last inspection, when known. */
  lastInspectionDate: dateTextSchema,
});

/** EIC: the work this certificate covers. */
export const workSectionSchema = z.object({
  description: text(2000),
  extent: text(2000),
  /** Departures from BS 7671, with the reason for each; empty when none. */
  departures: text(2000),
  /** Comments on the existing installation the new work connects to. */
  existingInstallationComments: text(2000),
});

/** Supply characteristics and earthing arrangements. */
export const supplySectionSchema = z.object({
  earthing: z.enum(earthingArrangements).nullable(),
  liveConductors: z.enum(liveConductorArrangements).nullable(),
  /** Nominal voltage to earth U0 (V). */
  u0V: optionalNumber('U0', 1000),
  /** Nominal voltage between lines U (V). */
  uV: optionalNumber('U', 1000),
  frequencyHz: optionalNumber('The frequency', 400),
  /** External earth fault loop impedance Ze at the origin (Ω). TT installations may read hundreds. */
  zeOhm: optionalNumber('Ze', 2000),
  /** Prospective fault current Ipf at the origin (kA). */
  ipfKa: optionalNumber('Ipf', 200),
  /** The supply's own protective device (the cut-out fuse). */
  supplyDeviceStandard: text(40),
  supplyDeviceType: text(40),
  supplyDeviceRatingA: optionalNumber('The rating of the supply’s device', 6300),
  /** Csa of the supply's neutral (mm²), when known: it sets the main bonding size on PME. */
  supplyNeutralCsaMm2: optionalNumber('The csa of the supply neutral', 1000),
});

/** Particulars of the installation at the origin. */
export const originSectionSchema = z.object({
  meansOfEarthing: z.enum(meansOfEarthing).nullable(),
  /** Earth electrode: its type (rod, tape, plate…) and resistance RA (Ω). */
  electrodeType: text(80),
  electrodeLocation: text(200),
  electrodeRaOhm: optionalNumber('RA', 100000),
  mainSwitchStandard: text(40),
  mainSwitchPoles: z.number().int().min(1).max(4).nullable(),
  mainSwitchRatingA: optionalNumber('The main switch rating', 6300),
  /** Where the main switch is an RCD: its rated residual current (mA) and measured time (ms). */
  mainSwitchRcdMa: optionalNumber('The main switch’s IΔn', 3000),
  mainSwitchRcdTimeMs: optionalNumber('The main switch’s RCD time', 10000),
  earthingConductorMaterial: z.enum(conductorMaterials).nullable(),
  earthingConductorCsaMm2: optionalNumber('The earthing conductor csa', 1000),
  earthingConductorVerified: yesNo,
  bondingConductorMaterial: z.enum(conductorMaterials).nullable(),
  bondingConductorCsaMm2: optionalNumber('The main bonding csa', 1000),
  bondingVerified: yesNo,
  bondedWater: bondedChoice,
  bondedGas: bondedChoice,
  bondedOil: bondedChoice,
  bondedStructuralSteel: bondedChoice,
  bondedLightningProtection: bondedChoice,
  /** Other extraneous-conductive-parts bonded, in words. */
  bondedOther: text(200),
});

export const limitationKinds = ['agreed', 'operational'] as const;
export const limitationSchema = z.object({
  kind: z.enum(limitationKinds),
  /** What was not inspected or tested. */
  what: text(400),
  /** Why. A limitation with no reason is a finding. */
  reason: text(400),
});
export type Limitation = z.infer<typeof limitationSchema>;

/** Extent of the inspection and testing, and its limitations. */
export const extentSectionSchema = z.object({
  extentCovered: text(2000),
  /** With whom the agreed limitations were agreed (name and role). */
  agreedWith: text(200),
  limitations: z.array(limitationSchema).max(50),
});

/** Outcome of one inspection item. `ok` acceptable (✓); `fail` not acceptable (✗, EIC only). */
export const inspectionOutcomes = ['ok', 'fail', 'C1', 'C2', 'C3', 'LIM', 'N/A', 'not-verified'] as const;
export type InspectionOutcome = (typeof inspectionOutcomes)[number];
/** Schedule of inspections: item id (see inspection-items.ts) → outcome. A missing item is blank. */
export const inspectionsSectionSchema = z.record(z.string().max(12), z.enum(inspectionOutcomes).nullable());

export const observationCodes = ['C1', 'C2', 'C3', 'FI'] as const;
export type ObservationCode = (typeof observationCodes)[number];
export const observationSchema = z.object({
  /** Shown as "observation 4"; unique on the job. */
  number: z.number().int().positive(),
  text: z.string().trim().min(1, 'Say what was observed.').max(1000),
  location: text(200),
  /** Null while not yet coded (a finding on an EICR). */
  code: z.enum(observationCodes).nullable(),
  boardId: z.number().int().positive().nullable(),
  circuitId: z.number().int().positive().nullable(),
  inspectionItem: z.string().max(12).nullable(),
});
export type Observation = z.infer<typeof observationSchema>;
/**
 * Observations, keyed by a stable id the client makes (e.g. `o-3f9a`), so two people can add and
 * edit different observations at once. A write of `null` removes one.
 */
export const observationsSectionSchema = z.record(z.string().min(1).max(40), observationSchema.nullable());

/** Summary: the overall assessment is derived (see `overallAssessment`), never typed. */
export const summarySectionSchema = z.object({
  /** The general condition of the installation, in words. */
  generalCondition: text(2000),
  /** Recommended interval to the next inspection (months). */
  nextInspectionMonths: z.number().int().min(1, 'At least one month.').max(120, 'At most ten years.').nullable(),
  /** Why this interval (required when shorter than the usual one for the premises). */
  nextInspectionReason: text(400),
});

export const declarationPersonSchema = z.object({
  name: text(120),
  position: text(120),
  /** YYYY-MM-DD or empty. */
  date: dateTextSchema,
});
export type DeclarationPerson = z.infer<typeof declarationPersonSchema>;
/**
 * The people responsible. EIC: designer, constructor, and inspector (one person may be all three:
 * `samePersonForAll`, then `inspector` holds them). EICR: inspector, and the reviewer named at review.
 */
export const declarationSectionSchema = z.object({
  samePersonForAll: z.boolean(),
  designer: declarationPersonSchema,
  constructor: declarationPersonSchema,
  inspector: declarationPersonSchema,
  reviewer: declarationPersonSchema,
});

export const jobSectionSchemas = {
  client: clientSectionSchema,
  installation: installationSectionSchema,
  work: workSectionSchema,
  supply: supplySectionSchema,
  origin: originSectionSchema,
  extent: extentSectionSchema,
  inspections: inspectionsSectionSchema,
  observations: observationsSectionSchema,
  summary: summarySectionSchema,
  declaration: declarationSectionSchema,
} as const;
export type JobSectionKey = keyof typeof jobSectionSchemas;
export const jobSectionKeys = Object.keys(jobSectionSchemas) as JobSectionKey[];
export const jobSectionKeySchema = z.enum(jobSectionKeys as [JobSectionKey, ...JobSectionKey[]]);
export type JobSectionData = { [K in JobSectionKey]: z.infer<(typeof jobSectionSchemas)[K]> };

/** Sections an EIC has; an EICR has all but `work`. */
export const sectionsFor = (kind: 'EIC' | 'EICR'): JobSectionKey[] =>
  jobSectionKeys.filter((key) => (kind === 'EIC' ? key !== 'observations' : key !== 'work'));

const blankPerson: DeclarationPerson = { name: '', position: '', date: '' };

/** A new job's record: every field blank. */
export function blankSection<K extends JobSectionKey>(key: K): JobSectionData[K] {
  const blanks: JobSectionData = {
    client: { orderedBy: '', orderedByAddress: '', reason: null, reasonDetail: '' },
    installation: {
      premises: null,
      wiringAgeYears: null,
      alterationsEvident: null,
      alterationsAgeYears: null,
      recordsAvailable: null,
      recordsHeldBy: '',
      lastInspectionDate: '',
    },
    work: { description: '', extent: '', departures: '', existingInstallationComments: '' },
    supply: {
      earthing: null,
      liveConductors: null,
      u0V: null,
      uV: null,
      frequencyHz: null,
      zeOhm: null,
      ipfKa: null,
      supplyDeviceStandard: '',
      supplyDeviceType: '',
      supplyDeviceRatingA: null,
      supplyNeutralCsaMm2: null,
    },
    origin: {
      meansOfEarthing: null,
      electrodeType: '',
      electrodeLocation: '',
      electrodeRaOhm: null,
      mainSwitchStandard: '',
      mainSwitchPoles: null,
      mainSwitchRatingA: null,
      mainSwitchRcdMa: null,
      mainSwitchRcdTimeMs: null,
      earthingConductorMaterial: null,
      earthingConductorCsaMm2: null,
      earthingConductorVerified: null,
      bondingConductorMaterial: null,
      bondingConductorCsaMm2: null,
      bondingVerified: null,
      bondedWater: null,
      bondedGas: null,
      bondedOil: null,
      bondedStructuralSteel: null,
      bondedLightningProtection: null,
      bondedOther: '',
    },
    extent: { extentCovered: '', agreedWith: '', limitations: [] },
    inspections: {},
    observations: {},
    summary: { generalCondition: '', nextInspectionMonths: null, nextInspectionReason: '' },
    declaration: {
      samePersonForAll: false,
      designer: blankPerson,
      constructor: blankPerson,
      inspector: blankPerson,
      reviewer: blankPerson,
    },
  };
  return structuredClone(blanks[key]);
}

/** A section as served: its data and the version to send back with a change. */
export const jobSectionStateSchema = z.object({ data: z.unknown(), version: z.number().int() });
export type JobSectionState<K extends JobSectionKey = JobSectionKey> = { data: JobSectionData[K]; version: number };
export type JobRecord = { [K in JobSectionKey]: JobSectionState<K> };

/**
 * A change to one section: the version last seen and only the fields that change. For a record
 * section (`inspections`, `observations`) the fields are its keys; otherwise its properties.
 */
export const writeJobSectionBodySchema = z.object({
  version: z.number({ error: 'Give the version of the section you last saw.' }).int().min(0),
  changes: z.record(z.string(), z.unknown()).refine((c) => Object.keys(c).length > 0, 'Nothing to change.'),
});
export type WriteJobSectionBody = z.infer<typeof writeJobSectionBodySchema>;

/**
 * Checks a change against its section's schema: every changed field must be a field of the
 * section with a valid value. Returns the parsed changes, or zod issues with paths by field.
 */
export function parseSectionChanges(key: JobSectionKey, changes: Record<string, unknown>) {
  const schema = jobSectionSchemas[key];
  if (schema instanceof z.ZodRecord) {
    return z.record(z.string(), (schema as z.ZodRecord<z.ZodString, z.ZodTypeAny>).valueType).safeParse(changes);
  }
  return (schema as z.ZodObject<z.ZodRawShape>).partial().strict().safeParse(changes);
}

// ---- the overall assessment, derived ----

export type OverallAssessment = 'satisfactory' | 'unsatisfactory' | 'not yet known';

/**
 * An EICR's overall assessment from its observations: any C1, C2 or FI makes it unsatisfactory,
 * C3 alone does not (BS 7671:2018 Appendix 6, notes on the condition report; domain.md). With an
 * observation not yet coded, it is not yet known.
 */
export function overallAssessment(observations: JobSectionData['observations']): {
  assessment: OverallAssessment;
  reason: string;
} {
  const list = Object.values(observations).filter((o): o is Observation => o !== null);
  const uncoded = list.filter((o) => o.code === null);
  const serious = list.filter((o) => o.code === 'C1' || o.code === 'C2' || o.code === 'FI');
  if (serious.length > 0) {
    const codes = serious
      .sort((a, b) => a.number - b.number)
      .map((o) => `observation ${o.number} (${o.code})`)
      .join(', ');
    return { assessment: 'unsatisfactory', reason: `Unsatisfactory because of ${codes}: any C1, C2 or FI makes the installation unsatisfactory.` };
  }
  if (uncoded.length > 0) {
    return { assessment: 'not yet known', reason: `${uncoded.length} observation(s) have no code yet.` };
  }
  const c3 = list.filter((o) => o.code === 'C3').length;
  return {
    assessment: 'satisfactory',
    reason: c3 > 0 ? `Satisfactory: ${c3} C3 observation(s) recommend improvement, which alone does not make it unsatisfactory.` : 'Satisfactory: no observation needs action.',
  };
}

/**
 * Usual interval to the next inspection for the premises (months), IET Guidance Note 3
 * Table 3.2 [memory]: the inspector may shorten it and says why.
 */
export const usualIntervalMonths: Record<(typeof premisesKinds)[number], number | null> = {
  domestic: 120,
  'rented-dwelling': 60,
  commercial: 60,
  industrial: 36,
  caravan: 36,
  'pool-or-similar': 12,
  other: null,
};

/** The next inspection date: the visit date plus the interval, as YYYY-MM-DD. */
export function nextInspectionDate(visitDate: string, months: number | null): string | null {
  if (!months || !/^\d{4}-\d{2}-\d{2}$/.test(visitDate)) return null;
  const [y, m, d] = visitDate.split('-').map(Number) as [number, number, number];
  const total = y * 12 + (m - 1) + months;
  const year = Math.floor(total / 12);
  const month = (total % 12) + 1;
  const lastDay = new Date(Date.UTC(year, month, 0)).getUTCDate();
  return `${year}-${String(month).padStart(2, '0')}-${String(Math.min(d, lastDay)).padStart(2, '0')}`;
}
