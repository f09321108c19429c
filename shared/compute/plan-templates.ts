/**
 * Inspection plan templates per core construction ("new plan from template", issue 3 point 5),
 * and the handling cautions the UI shows beside a characteristic.
 *
 * A template is a starting draft: the engineer edits it before activating. Every limit below is a
 * common practice starting value derived from the part's nominal dimensions; the drawing (or
 * the purchase order) governs, and the engineer replaces these where it says otherwise.
 *
 * How the characteristics fit together (the bench sheet relies on this):
 * - `variable`: readings are entered on the bench sheet, laid out as `layout` says
 *   (`readingsPerSample` = angles × levels for probed points, angles for heights). When the
 *   layout gives several readings that reduce to one value, `derivedFormula` names that
 *   reduction of the characteristic's own readings (circle fit, stack length) and `inputs` is
 *   null.
 * - `derived`: nothing is entered; the value is computed with `derivedFormula` from the raw
 *   readings of the characteristics named in `inputs` (ECC from the probed points of BORE_D
 *   and OD, taken in one CMM setup so both circles share one coordinate frame).
 * - `attribute`: a pass / fail check.
 */
import { CONSTRUCTIONS, type CharacteristicInput, type Construction, type GaugeKind } from '../schemas/master-data';
import { ComputeError } from './errors';

export type TemplateId = Construction | 'vented';

/** The part fields a template reads. */
export interface TemplatePart {
  nominalBoreMm: number;
  nominalOdMm: number;
  nominalStackLengthMm: number;
  laminationThicknessMm: number;
  slotCount: number;
  nominalMassKg: number;
}

export interface PlanTemplateSummary {
  id: TemplateId;
  name: string;
  description: string;
}

export interface PlanTemplate extends PlanTemplateSummary {
  characteristics: CharacteristicInput[];
}

export const TEMPLATE_IDS: readonly TemplateId[] = [...CONSTRUCTIONS, 'vented'];

/** For `GET /api/plan-templates`. */
export const PLAN_TEMPLATES: readonly PlanTemplateSummary[] = [
  { id: 'welded', name: 'Welded core', description: 'Common core checks plus weld count and positions, no filler build-up above the OD, no weld cracks.' },
  { id: 'interlocked', name: 'Interlocked core', description: 'Common core checks plus interlock engagement, separation gap and holding force.' },
  { id: 'bonded', name: 'Bonded core', description: 'Common core checks plus delamination and the peel / shear coupon.' },
  { id: 'cleated', name: 'Cleated core', description: 'Common core checks plus cleat count and seating.' },
  { id: 'riveted', name: 'Riveted core', description: 'Common core checks plus rivet count and seating.' },
  { id: 'segmented', name: 'Segmented core', description: 'Common core checks plus segment joint step and joint gap.' },
  { id: 'vented', name: 'Large vented core', description: 'Common core checks plus duct spacers and end plates, for large cores with radial ventilation ducts.' },
];

// ---------------------------------------------------------------------------------------------
// Starting limits. Common practice starting values; the drawing governs.
// ---------------------------------------------------------------------------------------------

/** Rounds away binary noise (0.35 × 100 = 35.00000000000001) so limits read as typed. */
function tidy(value: number, decimals = 4): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

/** Bore ± tolerance (mm): ±0.05 below 150 mm, ±0.08 from 150 mm. Common practice starting value; the drawing governs. */
export function boreToleranceMm(boreMm: number): number {
  return boreMm < 150 ? 0.05 : 0.08;
}

/** OD ± tolerance (mm). Common practice starting value; the drawing governs. */
export const OD_TOLERANCE_MM = 0.1;

/** Stack length ± tolerance (mm): 0.3 mm or 0.5 % of the length, whichever is larger. Common practice starting value; the drawing governs. */
export function stackLengthToleranceMm(stackLengthMm: number): number {
  return Math.max(0.3, 0.005 * stackLengthMm);
}

/** Bore-to-OD eccentricity upper limit (mm); it eats directly into the air gap. Common practice starting value; the drawing governs. */
export const ECCENTRICITY_USL_MM = 0.05;
/** End-face squareness upper limit (mm). Common practice starting value; the drawing governs. */
export const SQUARENESS_USL_MM = 0.1;
/** Core mass ± fraction. Common practice starting value; the drawing governs. */
export const MASS_TOLERANCE_FRACTION = 0.02;

/**
 * Burr height limit (µm): the smaller of 50 µm and 10 % of the lamination thickness
 * (common practice: 0.02–0.05 mm, or 5–10 % of thickness).
 */
export function burrLimitUm(laminationThicknessMm: number): number {
  return tidy(Math.min(50, 0.1 * laminationThicknessMm * 1000), 1);
}

/**
 * Starting minimum stacking factor (fraction) for a lamination thickness. (memory) IEC 60404-8-4
 * typical minimums: 0.95 at 0.35 mm and 0.97 at 0.50 mm. shared/compute/steel.ts had no
 * `typicalMinimumStackingFactor` when this was written, so the two points are inlined: linear
 * between them, and (common practice, an extrapolation) the same slope outside, held within
 * 0.90–0.98 so thin or thick gauges still get a plausible starting value.
 */
export function startingMinimumStackingFactor(laminationThicknessMm: number): number {
  const t0 = 0.35;
  const s0 = 0.95;
  const t1 = 0.5;
  const s1 = 0.97;
  const s = s0 + ((laminationThicknessMm - t0) * (s1 - s0)) / (t1 - t0);
  return tidy(Math.min(0.98, Math.max(0.9, s)), 3);
}

/** Franklin test current upper limit (A). Common practice starting value; the drawing governs. */
export const FRANKLIN_CURRENT_USL_A = 0.1;

/**
 * Surface insulation resistance per lamination from a Franklin-type test current
 * (ASTM A717 / IEC 60404-11): Rᵢ = 6.45 (1/I − 1) Ω·cm², I in A.
 */
export function franklinResistanceOhmCm2(currentA: number): number {
  if (!(currentA > 0 && currentA <= 1)) throw new ComputeError('The Franklin test current must be above 0 A and at most 1 A', 'current');
  return tidy(6.45 * (1 / currentA - 1), 4);
}

/** Interlock separation gap upper limit (mm). Common practice starting value; the drawing governs. */
export const INTERLOCK_GAP_USL_MM = 0.05;
/**
 * Interlock holding force lower limit (N). A placeholder starting value: the right figure depends
 * on the interlock size and count and comes from the drawing or the supplier's qualification.
 */
export const INTERLOCK_HOLDING_LSL_N = 100;
/** Bond coupon peel / shear lower limit (N). A placeholder starting value, as above. */
export const BOND_COUPON_LSL_N = 1000;
/** Segment joint step and gap upper limits (mm). Common practice starting values; the drawing governs. */
export const SEGMENT_STEP_USL_MM = 0.05;
export const SEGMENT_GAP_USL_MM = 0.05;

// ---------------------------------------------------------------------------------------------
// Builders
// ---------------------------------------------------------------------------------------------

function attribute(code: string, name: string, method: string, gaugeKind: GaugeKind | null, severity: 'critical' | 'major' | 'minor' = 'major'): CharacteristicInput {
  return { code, name, kind: 'attribute', unit: null, method, gaugeKind, layout: 'pass-fail', readingsPerSample: 1, severity };
}

function checkPart(part: TemplatePart): void {
  const positives: [keyof TemplatePart, string][] = [
    ['nominalBoreMm', 'nominal bore'],
    ['nominalOdMm', 'nominal OD'],
    ['nominalStackLengthMm', 'stack length'],
    ['laminationThicknessMm', 'lamination thickness'],
    ['nominalMassKg', 'nominal core mass'],
  ];
  for (const [field, label] of positives) {
    const v = part[field];
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) throw new ComputeError(`The part's ${label} must be a number above zero`, field);
  }
  if (!Number.isInteger(part.slotCount) || part.slotCount < 1) throw new ComputeError("The part's slot count must be a whole number of at least 1", 'slotCount');
  if (part.nominalBoreMm >= part.nominalOdMm) throw new ComputeError('The bore must be smaller than the OD', 'nominalBoreMm');
}

function commonCharacteristics(part: TemplatePart): CharacteristicInput[] {
  const bore = part.nominalBoreMm;
  const boreTol = boreToleranceMm(bore);
  const od = part.nominalOdMm;
  const length = part.nominalStackLengthMm;
  const lengthTol = stackLengthToleranceMm(length);
  const mass = part.nominalMassKg;
  const sfMinPercent = tidy(startingMinimumStackingFactor(part.laminationThicknessMm) * 100, 1);
  const burr = burrLimitUm(part.laminationThicknessMm);

  return [
    {
      code: 'BORE_D',
      name: 'Bore diameter',
      kind: 'variable',
      unit: 'mm',
      nominal: bore,
      lsl: tidy(bore - boreTol),
      usl: tidy(bore + boreTol),
      method:
        'Probe the bore on the CMM at 8 evenly spaced angles on 2 levels, about 5 mm in from each end face. Touch tooth tips, not slot openings. Keep the core in the same setup for the OD. The diameter is the least-squares circle through all points.',
      gaugeKind: 'cmm',
      layout: 'probed',
      angles: 8,
      levels: 2,
      readingsPerSample: 16,
      derivedFormula: 'circle-fit-diameter',
      inputs: null,
      chartKind: 'xbar-r',
      subgroupSize: null,
      severity: 'major',
    },
    {
      code: 'BORE_RND',
      name: 'Bore roundness',
      kind: 'derived',
      unit: 'mm',
      lsl: null,
      // Form error kept within the ± size tolerance (common practice starting value; the drawing governs).
      usl: boreTol,
      method: 'Computed from the bore points: spread of the points about the fitted circle (largest minus smallest radial distance).',
      derivedFormula: 'circle-fit-roundness',
      inputs: ['BORE_D'],
      severity: 'major',
    },
    {
      code: 'OD',
      name: 'Outside diameter',
      kind: 'variable',
      unit: 'mm',
      nominal: od,
      lsl: tidy(od - OD_TOLERANCE_MM),
      usl: tidy(od + OD_TOLERANCE_MM),
      // Probed rather than two-point: eccentricity needs the OD centre in the same frame as the bore's.
      method:
        'In the same CMM setup as the bore, probe the OD at 8 evenly spaced angles at mid-stack, avoiding weld beads, cleats and notches. The diameter is the least-squares circle through the points.',
      gaugeKind: 'cmm',
      layout: 'probed',
      angles: 8,
      levels: 1,
      readingsPerSample: 8,
      derivedFormula: 'circle-fit-diameter',
      inputs: null,
      chartKind: 'xbar-r',
      subgroupSize: null,
      severity: 'major',
    },
    {
      code: 'ECC',
      name: 'Bore-to-OD eccentricity',
      kind: 'derived',
      unit: 'mm',
      lsl: null,
      usl: ECCENTRICITY_USL_MM,
      method: 'Computed: distance between the bore circle centre and the OD circle centre. Any offset makes the air gap uneven.',
      derivedFormula: 'eccentricity',
      inputs: ['BORE_D', 'OD'],
      severity: 'critical',
    },
    {
      code: 'STACK_L',
      name: 'Stack length',
      kind: 'variable',
      unit: 'mm',
      nominal: length,
      lsl: tidy(length - lengthTol),
      usl: tidy(length + lengthTol),
      method:
        'Stand the core on one end face on a surface plate. Measure the height of the top face on the back iron at 4 positions 90° apart, starting at the reference slot. Stack length is the fitted mean height.',
      gaugeKind: 'height-gauge',
      layout: 'heights',
      angles: 4,
      readingsPerSample: 4,
      derivedFormula: 'stack-length',
      inputs: null,
      chartKind: 'xbar-r',
      subgroupSize: null,
      severity: 'major',
    },
    {
      code: 'SQUARE',
      name: 'End-face squareness',
      kind: 'derived',
      unit: 'mm',
      lsl: null,
      usl: SQUARENESS_USL_MM,
      method: 'Computed from the stack heights: tilt of the fitted top-face plane across the core diameter.',
      derivedFormula: 'squareness',
      inputs: ['STACK_L'],
      severity: 'major',
    },
    {
      code: 'MASS',
      name: 'Stack mass',
      kind: 'variable',
      unit: 'kg',
      nominal: mass,
      lsl: tidy(mass * (1 - MASS_TOLERANCE_FRACTION)),
      usl: tidy(mass * (1 + MASS_TOLERANCE_FRACTION)),
      method: 'Weigh the bare core, free of packaging, oil drips and loose parts, on a calibrated scale.',
      gaugeKind: 'scale',
      layout: 'single',
      readingsPerSample: 1,
      severity: 'minor',
    },
    {
      code: 'SF',
      name: 'Stacking factor',
      kind: 'derived',
      // The unit list has no plain ratio, so the factor is shown in percent (0.96 → 96 %).
      unit: '%',
      lsl: sfMinPercent,
      usl: null,
      method: "Computed: core mass ÷ (steel density × lamination net area × stack length), using the part's density and area. A low value means a light, loosely packed or short-counted stack.",
      derivedFormula: 'stacking-factor-mass',
      inputs: ['MASS', 'STACK_L'],
      severity: 'major',
    },
    {
      code: 'BURR',
      name: 'Burr height',
      kind: 'variable',
      unit: 'µm',
      lsl: null,
      usl: burr,
      method:
        'Measure burr height on the end lamination at 4 places 90° apart: on a tooth tip edge and on the slot edges. Use a burr gauge, or a micrometer over burr minus sheet thickness. Enter all 4 readings.',
      gaugeKind: 'burr-gauge',
      layout: 'single',
      // The 4 readings of one core form one subgroup on the X-bar/R chart.
      readingsPerSample: 4,
      chartKind: 'xbar-r',
      subgroupSize: 4,
      wearDriven: true,
      severity: 'major',
    },
    attribute(
      'BURR_SIDE',
      'Burrs all on one side',
      'Check both end faces and a few slot walls: every lamination must have its burr facing the same way, as stamped. Flipped laminations show as burrs on both faces.',
      'visual',
      'minor',
    ),
    attribute(
      'SLOT_GO',
      `Slot alignment — go/no-go gauge through all ${part.slotCount} slots`,
      'Push the go gauge through every slot, full length, by hand without forcing. Any slot where it sticks fails. Mark the slot with a paint pen.',
      'go-no-go',
    ),
    {
      code: 'INS_I',
      name: 'Interlaminar insulation — Franklin test current',
      kind: 'variable',
      unit: 'A',
      lsl: null,
      usl: FRANKLIN_CURRENT_USL_A,
      method: 'With the Franklin-type tester, press the contact head onto a clean end lamination at 5 spots away from the edges. Read the current at each spot. Lower current means better insulation.',
      gaugeKind: 'franklin-tester',
      layout: 'single',
      readingsPerSample: 5,
      severity: 'major',
    },
    {
      code: 'INS_R',
      name: 'Surface insulation resistance',
      kind: 'derived',
      unit: 'Ω·cm²',
      // The resistance that corresponds to the current limit, so the two limits agree.
      lsl: franklinResistanceOhmCm2(FRANKLIN_CURRENT_USL_A),
      usl: null,
      method: 'Computed from the Franklin test currents as insulation resistance per lamination.',
      derivedFormula: 'insulation-resistance',
      inputs: ['INS_I'],
      severity: 'major',
    },
    attribute(
      'RUST_PACK',
      'No rust; packaging intact',
      'Look over the cores and the pallet: no rust or staining, no dents or bent teeth, dunnage and corrosion protection in place, labels readable.',
      'visual',
      'minor',
    ),
    attribute(
      'PAPERS',
      'Certificate present; steel grade and heat numbers match',
      'Check a certificate of conformance came with the lot. The steel grade must match the part, and the heat or coil numbers must match the lot labels.',
      null,
      'critical',
    ),
  ];
}

function specificCharacteristics(template: TemplateId): CharacteristicInput[] {
  switch (template) {
    case 'welded':
      return [
        attribute('WELD_COUNT', 'Weld count and positions as drawn', 'Count the weld seams along the OD and check each sits at its drawn position relative to the reference slot.', 'visual'),
        attribute('WELD_BUILDUP', 'No weld filler build-up above the OD', 'Run a straight edge along each seam: the bead must not stand proud of the OD.', 'visual'),
        attribute('WELD_CRACK', 'No weld cracks', 'Inspect every seam under good light with a loupe, including both ends. Any crack fails the core.', 'visual', 'critical'),
      ];
    case 'interlocked':
      return [
        attribute('IL_ENGAGED', 'All interlocks engaged', 'Check every interlock row on the OD and both end faces: each tab is pressed home, none is sheared or lifted.', 'visual'),
        {
          code: 'IL_GAP',
          name: 'Interlock separation gap',
          kind: 'variable',
          unit: 'mm',
          lsl: null,
          usl: INTERLOCK_GAP_USL_MM,
          method: 'Try feeler blades between laminations around the OD, near the interlocks and midway between them. Enter the thickest blade that enters.',
          gaugeKind: 'feeler-gauge',
          layout: 'single',
          readingsPerSample: 1,
          severity: 'major',
        },
        {
          code: 'IL_HOLD',
          name: 'Interlock holding force',
          kind: 'variable',
          unit: 'N',
          lsl: INTERLOCK_HOLDING_LSL_N,
          usl: null,
          method:
            "Destructive: on one sampled core per lot, pull the end lamination off in the pull-off fixture and enter the peak force. Set the limit from the drawing or the supplier's qualification before activating.",
          gaugeKind: null,
          layout: 'single',
          readingsPerSample: 1,
          severity: 'major',
        },
      ];
    case 'bonded':
      return [
        attribute('BOND_DELAM', 'No delamination', 'Look around the OD, bore and slot walls for open seams. Try a thin feeler blade at any suspect seam: it must not enter.', 'visual'),
        {
          code: 'BOND_COUPON',
          name: 'Bond peel / shear coupon',
          kind: 'variable',
          unit: 'N',
          lsl: BOND_COUPON_LSL_N,
          usl: null,
          method:
            "Test the coupon supplied from the same bonding batch to failure and enter the peak force. Set the limit from the drawing or the supplier's qualification before activating.",
          gaugeKind: null,
          layout: 'single',
          readingsPerSample: 1,
          severity: 'major',
        },
      ];
    case 'cleated':
      return [
        attribute('CLEAT_COUNT', 'Cleat count as drawn', 'Count the cleats around the OD and check each sits in its drawn slot or notch.', 'visual'),
        attribute('CLEAT_SEATED', 'Cleats seated', 'Each cleat lies fully home in its groove along the whole length, with ends folded over, none lifted or loose.', 'visual'),
      ];
    case 'riveted':
      return [
        attribute('RIVET_COUNT', 'Rivet count as drawn', 'Count the rivets and check each sits at its drawn position.', 'visual'),
        attribute('RIVET_SEATED', 'Rivets seated', 'Each rivet head sits flat on both end faces, is fully formed and does not turn when tried by hand.', 'visual'),
      ];
    case 'segmented':
      return [
        {
          code: 'SEG_STEP',
          name: 'Segment joints flush (step at the joint)',
          kind: 'variable',
          unit: 'mm',
          lsl: null,
          usl: SEGMENT_STEP_USL_MM,
          method: 'At every segment joint, measure the step between the two segments on the bore side with a dial indicator on a stand. Enter the largest step.',
          gaugeKind: 'dial-indicator',
          layout: 'single',
          readingsPerSample: 1,
          severity: 'major',
        },
        {
          code: 'SEG_GAP',
          name: 'Segment joint gap',
          kind: 'variable',
          unit: 'mm',
          lsl: null,
          usl: SEGMENT_GAP_USL_MM,
          method: 'Try feeler blades into every segment joint from the OD side. Enter the thickest blade that enters at the widest joint.',
          gaugeKind: 'feeler-gauge',
          layout: 'single',
          readingsPerSample: 1,
          severity: 'major',
        },
      ];
    case 'vented':
      return [
        attribute('VENT_SPACERS', 'Duct spacers intact', 'Look into every ventilation duct: all spacers present, straight and fixed, ducts clear of debris.', 'visual'),
        attribute('END_PLATES', 'End plates seated', 'Both end plates sit flat on the stack with no gap, and their fixings are tight.', 'visual'),
      ];
  }
}

/** Builds a draft plan's characteristics for a template and a part. */
export function planTemplate(template: TemplateId, part: TemplatePart): PlanTemplate {
  const summary = PLAN_TEMPLATES.find((t) => t.id === template);
  if (!summary) throw new ComputeError(`Unknown template "${String(template)}"; use one of ${TEMPLATE_IDS.join(', ')}`, 'template');
  checkPart(part);
  return { ...summary, characteristics: [...commonCharacteristics(part), ...specificCharacteristics(template)] };
}

// ---------------------------------------------------------------------------------------------
// Handling cautions
// ---------------------------------------------------------------------------------------------

/**
 * Above this mass a core is not lifted by one person. 23 kg is a common manual-handling guide
 * value ((memory) the load constant of the revised NIOSH lifting equation); the site's lifting
 * procedure governs.
 */
export const HEAVY_CORE_GUIDE_KG = 23;

export const HANDLING_CAUTIONS = {
  sharpEdges:
    "Lamination edges and burrs cut. Wear cut-resistant gloves while handling or gauging the core, and keep bare forearms off slot edges. Follow the site's PPE procedure.",
  heavyCore: `Heavy core: above about ${HEAVY_CORE_GUIDE_KG} kg, a common manual-handling guide value, do not lift it alone. Use a team lift or a hoist. The site's lifting procedure governs.`,
  energized:
    "This test puts voltage on the core. Only trained and authorised people run it, with the area kept clear and the core isolated. Follow the site's electrical safety procedure and local codes.",
} as const;

export type CautionSubject = Pick<CharacteristicInput, 'code' | 'kind'> & Partial<Pick<CharacteristicInput, 'name' | 'unit' | 'nominal' | 'gaugeKind' | 'derivedFormula'>>;

const ENERGIZED_GAUGES: readonly GaugeKind[] = ['insulation-tester', 'franklin-tester'];
const CORE_LOSS_WORDS = /core[\s-]?loss|ring test|hot[\s-]?spot|flux test/i;

/**
 * The cautions the UI shows beside a characteristic. Computed characteristics and paperwork get
 * none: nobody touches the core for them. Pass the part's nominal mass so checks on a heavy core carry the
 * lifting caution; the mass characteristic itself also reads its nominal.
 */
export function cautionsFor(characteristic: CautionSubject, context: { coreMassKg?: number | null } = {}): string[] {
  const c = characteristic;
  // Paperwork (an attribute with no gauge) and computed values involve no handling of the core.
  const handsOn = c.kind === 'variable' || (c.kind === 'attribute' && c.gaugeKind != null);
  const coreLoss = c.kind !== 'derived' && (c.unit === 'W/kg' || CORE_LOSS_WORDS.test(`${c.name ?? ''} ${c.code}`));
  const energized = (c.gaugeKind != null && ENERGIZED_GAUGES.includes(c.gaugeKind)) || (c.kind !== 'derived' && c.unit === 'MΩ') || coreLoss;

  const ownMassKg = c.nominal == null ? null : c.unit === 'kg' ? c.nominal : c.unit === 'g' ? c.nominal / 1000 : null;
  const massKg = context.coreMassKg ?? ownMassKg;

  const out: string[] = [];
  if (handsOn || coreLoss) out.push(HANDLING_CAUTIONS.sharpEdges);
  if ((handsOn || coreLoss) && massKg != null && massKg > HEAVY_CORE_GUIDE_KG) out.push(HANDLING_CAUTIONS.heavyCore);
  if (energized) out.push(HANDLING_CAUTIONS.energized);
  return out;
}
