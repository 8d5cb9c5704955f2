/**
 * The catalogue of every code the engine can return. Codes are stable: once published a code
 * keeps its meaning and is never reused for something else. The README table and the OpenAPI
 * enums are generated from this one list, and a contract test keeps them in step.
 *
 * Citation format (checked by a test): "AISC 360-22 §J2.4", "AISC 360-22 Table J2.4",
 * "AISC Manual Part 9"; equations as "Eq. J2-4".
 */

export type CodeKind = 'check' | 'limit' | 'warning' | 'error';

export interface CodeInfo {
  readonly kind: CodeKind;
  readonly title: string;
  /** The published provision, or "" for advice and errors that rest on no clause. */
  readonly clause: string;
  /** What it means, for the README table. */
  readonly meaning: string;
  /** What to change when it fails or appears. */
  readonly fix: string;
}

function entry<K extends CodeKind>(kind: K, title: string, clause: string, meaning: string, fix: string): CodeInfo & { readonly kind: K } {
  return Object.freeze({ kind, title, clause, meaning, fix });
}

export const CODES = Object.freeze({
  // ---- strength limit states (checks[]) ----
  FILLET_WELD_METAL: entry('check', 'Fillet weld metal strength', 'AISC 360-22 §J2.4',
    'Shear rupture of the fillet weld metal on its effective throat, Rn = Fnw·Awe with the directional increase or the mixed-group rule where they apply.',
    'Use a larger or longer weld, or a stronger electrode if the base metal allows it.'),
  BASE_METAL_SHEAR_YIELD: entry('check', 'Base metal shear yielding along the weld', 'AISC 360-22 §J4.2',
    'Shear yielding of a connected part on the plane along the weld, Rn = 0.60·Fy·Agv.',
    'Use a thicker part or a longer weld line.'),
  BASE_METAL_SHEAR_RUPTURE: entry('check', 'Base metal shear rupture along the weld', 'AISC 360-22 §J4.2',
    'Shear rupture of a connected part on the plane along the weld, Rn = 0.60·Fu·Anv.',
    'Use a thicker part, a stronger steel or a longer weld line.'),
  BASE_METAL_TENSION_YIELD: entry('check', 'Base metal tension yielding across the weld', 'AISC 360-22 §J4.1',
    'Tension yielding of a connected part pulled across the weld line, Rn = Fy·Ag.',
    'Use a thicker part or a longer weld line.'),
  BASE_METAL_TENSION_RUPTURE: entry('check', 'Base metal tension rupture across the weld', 'AISC 360-22 §J4.1',
    'Tension rupture of a connected part pulled across the weld line, Rn = Fu·Ae.',
    'Use a thicker part, a stronger steel or a longer weld line.'),

  // ---- detailing limits (limits[]) ----
  FILLET_MIN_SIZE: entry('limit', 'Minimum fillet size for the thinner part', 'AISC 360-22 Table J2.4',
    'The fillet is smaller than the minimum size for the thinner part joined.',
    'Increase the weld size to at least the required value.'),
  FILLET_MAX_SIZE_EDGE: entry('limit', 'Maximum fillet size along an edge', 'AISC 360-22 §J2.2b',
    'A fillet along the edge of a part is larger than the edge allows (t for t < 1/4 in (6 mm), otherwise t - 1/16 in (2 mm)).',
    'Reduce the leg on that part, or mark the weld as built out to full throat if the drawings call for it.'),
  FILLET_MIN_LENGTH: entry('limit', 'Minimum fillet length', 'AISC 360-22 §J2.2b',
    'A fillet designed for strength is shorter than 4 times its size; its effective size is then taken as a quarter of its length.',
    'Lengthen the weld to at least 4 times its size to use the full size.'),
  FILLET_INTERMITTENT_SEGMENT: entry('limit', 'Minimum length of an intermittent segment', 'AISC 360-22 §J2.2b',
    'An intermittent fillet segment is shorter than 4 times its size or 1-1/2 in (38 mm).',
    'Lengthen each segment.'),
  FILLET_LAP_LENGTH: entry('limit', 'Minimum lap', 'AISC 360-22 §J2.2b',
    'The lap of a lap joint is less than 5 times the thinner part or 1 in (25 mm).',
    'Increase the lap.'),
  FILLET_FLAT_BAR_WELD_LENGTH: entry('limit', 'Longitudinal welds alone at the end of a flat bar', 'AISC 360-22 §J2.2b',
    'Longitudinal fillets used alone at the end of a flat bar in tension are shorter than the perpendicular distance between them.',
    'Lengthen the welds or add a transverse weld.'),

  // ---- advice (warnings[]) ----
  FILLET_MULTI_PASS: entry('warning', 'Multi-pass fillet', '',
    'A fillet larger than about 5/16 in (8 mm) usually takes more than one pass and costs more (common practice).',
    'Consider a smaller, longer weld.'),
  FILLET_SIZE_NOT_STANDARD: entry('warning', 'Non-standard fillet size', '',
    'A leg is not a whole multiple of 1/16 in (1 mm), the usual increment of specified fillet sizes.',
    'Round the size to a standard increment.'),
  FILLET_SHORT_EFFECTIVE_SIZE: entry('warning', 'Short weld: effective size reduced', 'AISC 360-22 §J2.2b',
    'The weld is shorter than 4 times its size, so its strength was computed with an effective size of a quarter of its length.',
    'Lengthen the weld to at least 4 times its size.'),
  END_LOADED_LENGTH_REDUCED: entry('warning', 'End-loaded weld: effective length reduced', 'AISC 360-22 §J2.2b',
    'An end-loaded weld longer than 100 times its size has its effective length reduced by beta (Eq. J2-1), or to 180 times its size beyond 300 times.',
    'Use a larger weld, or shorter welds in more lines.'),
  DIRECTIONAL_INCREASE_NOT_APPLIED: entry('warning', 'Directional increase not applied', 'AISC 360-22 §J2.4',
    'The group is neither a linear group of one size nor a group of longitudinal and transverse lines of one size, so the weld strength was taken without the directional increase.',
    'Use one weld size, or load angles of 0 and 90 degrees only, if the design relies on the increase.'),
  ELECTRODE_UNDERMATCHED: entry('warning', 'Electrode under-matched', '',
    'The electrode is weaker than matching filler metal for the strongest connected part.',
    'Use matching filler metal unless under-matching is intended and the weld is designed for it.'),
  ELECTRODE_OVERMATCHED: entry('warning', 'Electrode over-matched', '',
    'The electrode is well above the strength of the weakest connected part; the extra strength is not usable and over-matched welds are less ductile and cost more.',
    'Use matching filler metal.'),
  BASE_METAL_GOVERNS: entry('warning', 'Base metal governs', '',
    'A base-metal limit state governs over the weld metal: a larger weld gains nothing on that part.',
    'Use a thicker or stronger part, or a longer weld line, rather than a larger weld.'),
  NO_DEMAND_GIVEN: entry('warning', 'No required strength given', '',
    'The request gave no load, so strengths are reported without ratios and the status reflects the detailing limits only.',
    'Give load.force to check the strength.'),

  // ---- errors (422 problem answers) ----
  MATERIAL_FY_EXCEEDS_FU: entry('error', 'Yield strength above tensile strength', '',
    'A steel given by numbers has fy greater than fu.',
    'Check the material values.'),
  MATERIAL_THICKNESS_OUT_OF_RANGE: entry('error', 'Thickness outside the grade\'s catalogue range', '',
    'The part is thicker than the catalogue covers for that grade.',
    'Give fy and fu for the part directly.'),
  UNKNOWN_MATERIAL: entry('error', 'Unknown material', '',
    'A steel or electrode name is not in the catalogue.',
    'Use a name from GET /v1/catalog/steels or /v1/catalog/electrodes, or give the values directly.'),
  INTERMITTENT_PITCH_TOO_SHORT: entry('error', 'Intermittent pitch shorter than the segment', '',
    'The pitch of intermittent segments is shorter than a segment, so the segments would overlap.',
    'Give a pitch at least equal to the segment length, or make the weld continuous.'),
  GEOMETRY_MEANINGLESS: entry('error', 'Geometry without meaning', '',
    'The geometry is well-typed but describes no weld that can exist.',
    'Check the dimensions named in the answer.'),
} satisfies Record<string, CodeInfo>);

export type Code = keyof typeof CODES;
type CodesOfKind<K extends CodeKind> = { [C in Code]: (typeof CODES)[C]['kind'] extends K ? C : never }[Code];
export type CheckCode = CodesOfKind<'check'>;
export type LimitCode = CodesOfKind<'limit'>;
export type WarningCode = CodesOfKind<'warning'>;
export type ErrorCode = CodesOfKind<'error'>;

export function codesOfKind(kind: CodeKind): string[] {
  return (Object.keys(CODES) as Code[]).filter((c) => CODES[c].kind === kind);
}
