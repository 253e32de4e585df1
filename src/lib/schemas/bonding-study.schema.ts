import { z } from 'zod';
import './plain-messages';
import { checkBondingStudy } from '../calc/bonding/study-checks';
import { checkCableConstruction } from '../calc/cable/construction-checks';
import { DERIVED_ENGINE_FIELDS, deriveCableParameters } from '../calc/cable/derive-cable';
import { conductorMetals, sheathMetals } from '../calc/cable/materials';
import { strandings } from '../calc/cable/conductor';

// The input of a bonding study: one schema for the forms, the endpoints, the command line and
// the stored JSON. Units are in the field names. Cross-field rules (geometry, topology) live
// in the calculation core and are reported here field by field.

/**
 * Sizes the core accepts. Beyond them a study is refused with the field named, rather than
 * solved for minutes or overflowing memory: 2,000 sections is more than ten times the longest
 * jointed land route; 40 metallic conductors in a cross-section is four double-circuit routes
 * with ECCs.
 */
export const STUDY_LIMITS = {
  sections: 2000,
  cases: 200,
  /** Sections × cases: each case returns figures for every section (some 5 MB per case at 2,000 sections). */
  sectionCases: 20_000,
  /** Sheaths (three per circuit) and ECCs together in one cross-section. */
  conductors: 40,
  circuits: 13,
  eccs: 10,
  cableTypes: 50,
  layouts: 200,
  svls: 2001,
  overrides: 2001,
  /** Shortest section: below a millimetre a length is a typing error, not a cable. */
  minSectionLengthM: 0.001,
  /** Longest section and route: above the longest cable routes built (some 760 km; from memory). */
  maxRouteLengthM: 1_000_000,
  /** Largest current in any case: above any power-system fault level (common practice). */
  maxCurrentA: 500_000,
  /** Earth resistances the solve stays well conditioned for. */
  minEarthOhm: 0.001,
  maxEarthOhm: 1_000_000,
} as const;

const L = STUDY_LIMITS;
const atMost = (n: number, what: string) => `At most ${n} ${what}; split the study.`;

const id = z.string().trim().min(1, 'Give an identifier.').max(40);
const positive = (what: string) => z.number({ error: `${what} must be a number.` }).positive(`${what} must be greater than zero.`);
const nonNegative = (what: string) => z.number({ error: `${what} must be a number.` }).nonnegative(`${what} cannot be negative.`);

/** Figures every cable type gives the engine, however it was entered. */
const cableTypeCommon = {
  id,
  name: z.string().min(1),
  oversheathThicknessMm: positive('Oversheath thickness'),
  overallDiameterMm: positive('Overall cable diameter'),
  /** Power-frequency withstand of the oversheath, r.m.s., for the fault duration. */
  oversheathWithstandKv: positive('Oversheath withstand voltage'),
  /** λ1 the cable's current rating assumed (IEC 60287-1-1); the study's λ1 is checked against it. */
  ratingLossFactor: nonNegative('Loss factor assumed in the rating').max(10).optional(),
};

/** The maker's figures, entered as they are (`entry` absent means direct, as in studies before constructions). */
export const directCableTypeSchema = z.strictObject({
  ...cableTypeCommon,
  entry: z.literal('direct').optional(),
  conductorResistanceOhmPerKm: positive('Conductor a.c. resistance at operating temperature'),
  conductorGmrMm: positive('Conductor geometric mean radius'),
  sheathMeanDiameterMm: positive('Sheath mean diameter'),
  sheathResistanceOhmPerKm: positive('Sheath resistance at operating temperature'),
});

const temperatureC = (what: string) =>
  z.number({ error: `${what} must be a number (°C).` }).min(-40, `${what} below −40 °C is not an operating temperature.`).max(250, `${what} above 250 °C is beyond any cable insulation: check the units (°C).`);
const wireMetal = z.enum(['copper', 'aluminium'], { error: 'Choose copper or aluminium.' });

/** What a cable is made of; the engine's figures are derived from it (src/lib/calc/cable). */
export const cableConstructionSchema = z.strictObject({
  /** Frequency the conductor's a.c. resistance (skin effect) is derived for. */
  frequencyHz: z.union([z.literal(50), z.literal(60)], { error: 'Frequency must be 50 or 60 Hz.' }).default(50),
  conductor: z.strictObject({
    material: z.enum(conductorMetals, { error: 'Conductor material: copper or aluminium.' }),
    crossSectionMm2: positive('Conductor cross-section').max(4000, 'A conductor above 4,000 mm² is larger than any cable made: check the units (mm²).'),
    /** Outer diameter of the conductor (maker's data). */
    diameterMm: positive('Conductor diameter').max(100, 'A conductor diameter above 100 mm is not a cable conductor: check the units (mm).'),
    stranding: z.enum(strandings, { error: 'Stranding: solid, stranded, compacted or segmental.' }),
    /** Equal round strands in concentric lay (stranded only). */
    strandCount: z.number({ error: 'Strand count must be a number.' }).int('Strand count must be a whole number.').optional(),
    /** Segments of a Milliken conductor (segmental only). */
    segmentCount: z.number({ error: 'Segment count must be a number.' }).int('Segment count must be a whole number.').optional(),
    /** d.c. resistance at 20 °C from IEC 60228 or the maker; without it, ρ20/A of the nominal area. */
    resistance20OhmPerKm: positive('Conductor d.c. resistance at 20 °C').optional(),
    operatingTemperatureC: temperatureC('Conductor operating temperature'),
  }),
  screen: z.discriminatedUnion(
    'kind',
    [
      z.strictObject({
        kind: z.literal('tubular'),
        material: z.enum(sheathMetals, { error: 'Choose the sheath metal.' }),
        meanDiameterMm: positive('Sheath mean diameter').max(300, 'A sheath mean diameter above 300 mm is not a cable: check the units (mm).'),
        thicknessMm: positive('Sheath thickness').max(20, 'A sheath thicker than 20 mm is not a cable sheath: check the units (mm).'),
        operatingTemperatureC: temperatureC('Sheath operating temperature'),
      }),
      z.strictObject({
        kind: z.literal('wires'),
        material: wireMetal,
        wireCount: z.number({ error: 'Wire count must be a number.' }).int('Wire count must be a whole number.').min(1, 'Give at least one wire.').max(1000, 'At most 1,000 screen wires.'),
        wireDiameterMm: positive('Screen wire diameter').max(10, 'A screen wire thicker than 10 mm is not a screen wire: check the units (mm).'),
        diameterUnderWiresMm: positive('Diameter under the screen wires').max(300, 'A diameter above 300 mm is not a cable: check the units (mm).'),
        /** Lay length of the helically applied wires; without it the wires count as straight. */
        layLengthMm: positive('Lay length of the screen wires').optional(),
        /** A longitudinally applied foil or tape over the wires, in parallel with them. */
        foil: z.strictObject({ material: wireMetal, thicknessMm: positive('Foil thickness').max(2, 'A foil thicker than 2 mm is a sheath: enter it as tubular.') }).optional(),
        operatingTemperatureC: temperatureC('Screen operating temperature'),
      }),
    ],
    { error: 'Screen kind: "tubular" (a sheath) or "wires" (a wire screen).' },
  ),
});

/**
 * Derived from the construction. Stored studies carry the derived figures too; read back they
 * must equal the derivation, so a hand-edited figure is refused, never silently replaced.
 */
export const constructionCableTypeSchema = z
  .strictObject({
    ...cableTypeCommon,
    entry: z.literal('construction'),
    construction: cableConstructionSchema,
    conductorResistanceOhmPerKm: z.number().optional(),
    conductorGmrMm: z.number().optional(),
    sheathMeanDiameterMm: z.number().optional(),
    sheathResistanceOhmPerKm: z.number().optional(),
  })
  .check(
    z.superRefine((t, ctx) => {
      const issues = checkCableConstruction(t);
      for (const issue of issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
      if (issues.length > 0) return;
      const derived = deriveCableParameters(t.construction);
      for (const key of DERIVED_ENGINE_FIELDS) {
        const given = t[key];
        if (given !== undefined && !(Math.abs(given - derived[key]) <= 1e-9 * Math.abs(derived[key])))
          ctx.addIssue({ code: 'custom', path: [key], message: `Derived from the construction as ${derived[key].toPrecision(6)}: change the construction, or enter the cable type as "direct" to give the maker's figure.` });
      }
    }, { when: (payload: { issues: unknown[] }) => payload.issues.length === 0 }),
  )
  .transform((t) => {
    const d = deriveCableParameters(t.construction);
    return { ...t, conductorResistanceOhmPerKm: d.conductorResistanceOhmPerKm, conductorGmrMm: d.conductorGmrMm, sheathMeanDiameterMm: d.sheathMeanDiameterMm, sheathResistanceOhmPerKm: d.sheathResistanceOhmPerKm };
  });

/** A catalogue or study cable type: the maker's figures ("direct") or a construction they are derived from. */
export const cableTypeSchema = z.discriminatedUnion('entry', [directCableTypeSchema, constructionCableTypeSchema], {
  error: 'Entry: "direct" (the maker\'s figures) or "construction".',
});

export const circuitSchema = z.strictObject({
  id,
  name: z.string().min(1),
  cableTypeId: id,
});

export const eccSchema = z.strictObject({
  id,
  name: z.string().min(1),
  resistanceOhmPerKm: positive('ECC resistance'),
  gmrMm: positive('ECC geometric mean radius'),
  /** First and last section (ids) the ECC runs along; it is earthed at both ends of its run. */
  fromSectionId: id,
  toSectionId: id,
  /** Cross the ECC to the mirror position at the middle of its run (by chainage, inside a section if need be). */
  transposedAtMidpoint: z.boolean().default(false),
  /**
   * Or: the joints (route joint numbers, strictly inside the ECC's run) where it crosses to the
   * mirror position; each further crossing swaps it back. Absent in studies before it existed.
   * An empty list crosses nowhere (the calculation always read it so): it is kept as absent, so
   * the form, the record and the comparisons all say "not transposed" and stored studies holding
   * an empty list read and calculate exactly as they did.
   */
  transposedAtJoints: z
    .array(z.number({ error: 'A transposition joint must be a joint number.' }).int('A transposition joint must be a whole joint number.').nonnegative('Joint numbers start at 0.'))
    .max(L.sections, atMost(L.sections, 'transposition joints'))
    .transform((joints) => (joints.length ? joints : undefined))
    .optional(),
  /** For the adiabatic check of its fault current; no check without it. */
  crossSectionMm2: positive('ECC cross-section').max(5000).optional(),
  material: z.enum(['copper', 'aluminium']).default('copper'),
});

const formationSchema = z.discriminatedUnion('formation', [
  z.strictObject({
    circuitId: id,
    formation: z.literal('trefoil'),
    /** Axial spacing of adjacent cables; touching trefoil equals the overall diameter. */
    spacingM: positive('Spacing'),
    depthM: positive('Depth'),
    centreXM: z.number().default(0),
  }),
  z.strictObject({
    circuitId: id,
    formation: z.literal('flat'),
    spacingM: positive('Spacing'),
    depthM: positive('Depth'),
    centreXM: z.number().default(0),
  }),
  z.strictObject({
    circuitId: id,
    formation: z.literal('coordinates'),
    /** Positions of the cables carrying phases a, b, c (x across the route, depth below ground). */
    positions: z.array(z.strictObject({ xM: z.number(), depthM: positive('Depth') })).length(3, 'Give three positions: a, b and c.'),
  }),
]);

export const layoutSchema = z.strictObject({
  id,
  name: z.string().default(''),
  circuits: z.array(formationSchema).min(1, 'Place at least one circuit.').max(L.circuits, atMost(L.circuits, 'circuits')),
  eccs: z.array(z.strictObject({ eccId: id, xM: z.number(), depthM: positive('ECC depth') })).max(L.eccs, atMost(L.eccs, 'ECCs')).default([]),
});

export const sectionSchema = z.strictObject({
  id,
  lengthM: positive('Section length')
    .min(L.minSectionLengthM, 'A section shorter than a millimetre is not a cable section: check the units (metres).')
    .max(L.maxRouteLengthM, `A section longer than ${L.maxRouteLengthM / 1000} km is longer than any cable route: check the units (metres).`),
  layoutId: id,
  /** Cable transposition at the section's start: the cables shift this many positions (0, 1, 2). */
  phaseRotation: z.union([z.literal(0), z.literal(1), z.literal(2)]).default(0),
});

export const bondingGroupSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('solid'), sectionIds: z.array(id).min(1).max(L.sections) }),
  z.strictObject({
    kind: z.literal('single-point'),
    sectionIds: z.array(id).min(1).max(L.sections),
    earthedAt: z.enum(['start', 'end', 'middle']),
  }),
  z.strictObject({ kind: z.literal('cross-bonded'), sectionIds: z.array(id).max(L.sections) }),
]);

export const svlSchema = z.strictObject({
  /** Joint number along the route: 0 is the route start, n the end, k the joint after the k-th section. */
  jointIndex: z.number().int().nonnegative(),
  connection: z.enum(['to-earth', 'across-joint']),
  continuousRatingV: positive('SVL continuous operating voltage'),
  /** Temporary-overvoltage capability for the fault duration (maker's data). */
  tovRatingV: positive('SVL temporary-overvoltage capability'),
  conductingResistanceOhm: positive('SVL resistance when conducting').default(0.5),
  /** Energy the SVL absorbs without damage (maker's data), kJ; the energy estimate is shown without a limit when absent. */
  energyRatingKJ: positive('SVL energy rating').optional(),
});

const phase = z.enum(['a', 'b', 'c']);
const faultCurrent = (what: string) =>
  positive(what).max(L.maxCurrentA, `A current above ${L.maxCurrentA / 1000} kA is above any fault level: check the units (amperes).`);
/** A current phasor in a fault, A and degrees; angles matter when two currents meet. */
const currentPhasor = (what: string) => z.strictObject({ currentA: faultCurrent(what), angleDeg: z.number().default(0) });
/** Share of the fault current returning through the source-end station grid; the rest returns by paths outside this route. 1 (the default) is all of it. */
const sourceStationShare = z.number().min(0, 'The share cannot be negative.').max(1, 'The share cannot exceed 1.').default(1);

export const caseKinds = ['normal', 'emergency', 'three-phase-fault', 'earth-fault', 'phase-phase-earth-fault', 'internal-fault', 'station-gpr'] as const;

export const caseSchema = z.strictObject({
  id,
  name: z.string().min(1),
  /**
   * normal and emergency: load, each with its own currents; three-phase-fault, earth-fault,
   * phase-phase-earth-fault: through faults beyond an end of the route; internal-fault: a
   * core-to-sheath breakdown on the route; station-gpr: a station earth rise from a fault
   * elsewhere, carried into the route ends.
   */
  kind: z.enum(caseKinds),
  /** Fault duration including back-up clearance, s; needed for faults. */
  durationS: positive('Duration').max(10, 'A fault lasting more than 10 s is not cleared: check the units (seconds).').optional(),
  /** Balanced positive-sequence currents per circuit (load or three-phase fault). */
  currents: z
    .array(z.strictObject({ circuitId: id, currentA: nonNegative('Current').max(L.maxCurrentA, `A current above ${L.maxCurrentA / 1000} kA is above any fault level: check the units (amperes).`), angleDeg: z.number().default(0) }))
    .max(L.circuits, atMost(L.circuits, 'circuit currents'))
    .default([]),
  earthFault: z
    .strictObject({
      circuitId: id,
      phase,
      currentA: faultCurrent('Earth-fault current'),
      /** The fault lies beyond this end of the route; the source neutral is at the other end. */
      beyond: z.enum(['start', 'end']).default('end'),
      sourceStationShare,
    })
    .optional(),
  /** Two phases faulted together to earth beyond an end: each phase's current; the earth takes their sum. */
  phasePhaseEarthFault: z
    .strictObject({
      circuitId: id,
      phases: z.tuple([phase, phase]),
      currents: z.tuple([currentPhasor('Fault current'), currentPhasor('Fault current')]),
      beyond: z.enum(['start', 'end']).default('end'),
      sourceStationShare,
    })
    .optional(),
  /**
   * A core-to-sheath breakdown on the route: at a joint (the sheath arriving at it, or leaving
   * it) or at a chainage, fed from the start, the end or both; each infeed returns to the
   * source neutral at its own station.
   */
  internalFault: z
    .strictObject({
      circuitId: id,
      phase,
      jointIndex: z.number().int().nonnegative().optional(),
      side: z.enum(['arriving', 'leaving']).default('arriving'),
      chainageM: z.number().positive('The fault chainage must lie inside the route.').optional(),
      /** Current flowing from the route start towards the fault. */
      fromStart: z.strictObject({ currentA: nonNegative('Infeed from the start').max(L.maxCurrentA), angleDeg: z.number().default(0) }).default({ currentA: 0, angleDeg: 0 }),
      /** Current flowing from the route end towards the fault. */
      fromEnd: z.strictObject({ currentA: nonNegative('Infeed from the end').max(L.maxCurrentA), angleDeg: z.number().default(0) }).default({ currentA: 0, angleDeg: 0 }),
    })
    .optional(),
  /**
   * Station earth potential rise from a fault elsewhere, as the rise the station would have
   * without this route: carried in as a current of GPR/R_grid into the station grid (a Norton
   * source), so the route's own sheaths and earths load it down.
   */
  stationGpr: z
    .array(z.strictObject({ station: z.enum(['start', 'end']), voltageV: positive('Station earth potential rise').max(1e6), angleDeg: z.number().default(0) }))
    .max(2)
    .default([]),
  svlsConducting: z.boolean().default(false),
});

const earthOhm = (what: string) =>
  positive(what)
    .min(L.minEarthOhm, `${what} below ${L.minEarthOhm * 1000} mΩ is not an electrode: check the units (ohms).`)
    .max(L.maxEarthOhm, `${what} above ${L.maxEarthOhm / 1000} kΩ is not an electrode: for a box with no electrode, say so with "noElectrode".`);

/**
 * The electrode at one joint, replacing the study-wide value there. `noElectrode` is for a
 * cross-bonding link box installed without an electrode of its own: its SVL star point then
 * connects to nothing but the SVLs.
 */
export const earthingOverrideSchema = z
  .strictObject({
    jointIndex: z.number().int().nonnegative(),
    resistanceOhm: earthOhm('Earth resistance').optional(),
    noElectrode: z.literal(true).optional(),
  })
  .refine((o) => (o.resistanceOhm === undefined) !== (o.noElectrode === undefined), {
    message: 'Give either the electrode resistance or "noElectrode": true, not both and not neither.',
    path: ['resistanceOhm'],
  });

/**
 * Electrodes: each route end has its station grid, each link box (cross-bonding or earthing)
 * its electrode; every one is a node of the network joined to remote earth through this
 * resistance.
 */
export const earthingSchema = z.strictObject({
  routeStartOhm: earthOhm('Earth resistance at the route start'),
  routeEndOhm: earthOhm('Earth resistance at the route end'),
  linkBoxOhm: earthOhm('Earth resistance at link boxes'),
  overrides: z.array(earthingOverrideSchema).max(L.overrides, atMost(L.overrides, 'earthing overrides')).default([]),
});

/** A joint bay's own name ("JB-3"); joints without one are called J0, J1, … by their number. */
export const jointNameSchema = z.strictObject({
  jointIndex: z.number({ error: 'The joint must be a joint number.' }).int('The joint must be a whole joint number.').nonnegative('Joint numbers start at 0.'),
  name: z.string().trim().min(1, 'Give the joint bay a name, or remove the entry.').max(40, 'A joint bay name has at most 40 characters.'),
});

export const bondingStudyBaseSchema = z.strictObject({
  kind: z.literal('bonding'),
  title: z.string().min(1, 'Give the study a title.'),
  frequencyHz: z.union([z.literal(50), z.literal(60)], { error: 'Frequency must be 50 or 60 Hz.' }),
  soilResistivityOhmM: positive('Soil resistivity').max(100_000, 'A soil resistivity above 100 000 Ω·m is not soil: check the units (Ω·m).'),
  cableTypes: z.array(cableTypeSchema).min(1, 'Add a cable type.').max(L.cableTypes, atMost(L.cableTypes, 'cable types')),
  circuits: z.array(circuitSchema).min(1, 'Add a circuit.').max(L.circuits, atMost(L.circuits, 'circuits')),
  eccs: z.array(eccSchema).max(L.eccs, atMost(L.eccs, 'ECCs')).default([]),
  layouts: z.array(layoutSchema).min(1, 'Add a layout.').max(L.layouts, atMost(L.layouts, 'layouts')),
  sections: z.array(sectionSchema).min(1, 'Add at least one route section.').max(L.sections, atMost(L.sections, 'route sections')),
  /** Names of joint bays by joint number; optional (absent in studies before it existed). */
  jointNames: z.array(jointNameSchema).max(L.sections + 1, atMost(L.sections + 1, 'joint names')).optional(),
  bonding: z.array(bondingGroupSchema).min(1, 'Say how the sheaths are bonded.').max(L.sections, atMost(L.sections, 'bonding groups')),
  earthing: earthingSchema,
  /**
   * Impedance of each cross-bonding lead, mΩ (0: ideal), as one total; or `bondingLeadLength`
   * instead. Without either it is {r: 0, x: 0}, filled in after the checks (as before the
   * alternative existed), so stored studies parse to the same object.
   */
  bondingLeadMilliohm: z.strictObject({ r: nonNegative('Lead resistance'), x: nonNegative('Lead reactance') }).optional(),
  /**
   * Each cross-bonding lead by its length: per-metre figures, or the resistance derived from
   * the conductor in `bondingLeads` (src/lib/calc/bonding/bonding-lead.ts).
   */
  bondingLeadLength: z
    .strictObject({
      lengthM: positive('Bonding lead length').max(1000, 'A bonding lead longer than 1 km is not a link-box lead: check the units (metres).'),
      /** Omitted: derived from the cross-section and material in `bondingLeads`. */
      resistanceMilliohmPerM: nonNegative('Lead resistance per metre').max(1000).optional(),
      /** Omitted: 0 (a concentric lead's reactance is small; common practice). */
      reactanceMilliohmPerM: nonNegative('Lead reactance per metre').max(1000).optional(),
    })
    .optional(),
  svls: z.array(svlSchema).max(L.svls, atMost(L.svls, 'SVL entries')).default([]),
  /** Cross-bonding and earthing leads, for their adiabatic check; no check without them. */
  bondingLeads: z.strictObject({ crossSectionMm2: positive('Bonding lead cross-section').max(5000), material: z.enum(['copper', 'aluminium']).default('copper') }).optional(),
  /** Temperatures for the adiabatic checks of ECCs and leads, °C (defaults: common practice for PVC-covered copper up to 300 mm², from memory). */
  adiabatic: z
    .strictObject({ initialC: z.number().min(-40).max(250).default(50), finalC: z.number().min(0).max(1100).default(160) })
    .refine((a) => a.finalC > a.initialC, { message: 'The final temperature must be above the initial one.', path: ['finalC'] })
    .default({ initialC: 50, finalC: 160 }),
  /** Where people stand at link boxes and route ends, for the IEEE Std 80 tolerable touch voltage. */
  touch: z
    .strictObject({
      bodyWeightKg: z.union([z.literal(50), z.literal(70)]).default(50),
      surfaceLayer: z.strictObject({ resistivityOhmM: positive('Surface layer resistivity'), thicknessM: positive('Surface layer thickness') }).optional(),
    })
    .default({ bodyWeightKg: 50 }),
  cases: z.array(caseSchema).min(1, 'Add at least one case.').max(L.cases, atMost(L.cases, 'cases')),
});

// Cross-field checks run once every field is valid on its own, so they can trust the numbers.
const onlyWhenFieldsValid = { when: (payload: { issues: unknown[] }) => payload.issues.length === 0 };

export const bondingStudySchema = bondingStudyBaseSchema
  .check(
    z.superRefine((study: z.output<typeof bondingStudyBaseSchema>, ctx) => {
      for (const issue of checkBondingStudy(study)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
    }, onlyWhenFieldsValid),
  )
  // The default of the total lead impedance, given only when the leads are not given by length.
  .transform((study) => (study.bondingLeadMilliohm || study.bondingLeadLength ? study : { ...study, bondingLeadMilliohm: { r: 0, x: 0 } }));

export type BondingStudyInput = z.input<typeof bondingStudySchema>;
export type BondingStudy = z.output<typeof bondingStudySchema>;
export type CableType = z.output<typeof cableTypeSchema>;
export type CableTypeInput = z.input<typeof cableTypeSchema>;
export type CableConstruction = z.output<typeof cableConstructionSchema>;
export type ConstructionCableTypeFields = z.output<typeof constructionCableTypeSchema>;
export type StudyCase = z.output<typeof caseSchema>;
export type Layout = z.output<typeof layoutSchema>;
