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
  // groove welds (PJP and CJP)
  PJP_WELD_METAL: entry('check', 'PJP groove weld metal strength', 'AISC 360-22 Table J2.5',
    'Strength of the PJP (or flare) groove weld metal on its effective area, Rn = Fnw·Awe with Fnw = 0.60·FEXX (0.90·FEXX in compression not finished to bear).',
    'Deepen the groove, weld both sides, use a process and position with no throat deduction, or a stronger electrode.'),
  PJP_BASE_METAL_TENSION: entry('check', 'Base metal tension rupture at the PJP fusion face', 'AISC 360-22 Table J2.5',
    'Tension rupture of a connected part at the fusion face of a PJP groove weld loaded in tension normal to its axis, Rn = Fu·ABM, ABM = effective throat × length (not more than the part).',
    'Deepen the groove or weld both sides, or use a stronger steel.'),
  PJP_BASE_METAL_COMPRESSION: entry('check', 'Base metal compression at the PJP fusion face', 'AISC 360-22 Table J2.5',
    'Compression yielding of a connected part at the fusion face of a PJP groove weld loaded in compression normal to its axis, Rn = Fy·ABM, ABM = effective throat × length (not more than the part).',
    'Deepen the groove or weld both sides, finish the joint to bear, or use a stronger steel.'),
  BASE_METAL_COMPRESSION_YIELD: entry('check', 'Base metal compression yielding across the weld', 'AISC 360-22 §J4.4',
    'Compression yielding of a connected part pushed across the weld line (Lc/r <= 25), Rn = Fy·Ag.',
    'Use a thicker part, a stronger steel or a longer weld line.'),
  GROOVE_WELD_METAL_EXEMPT: entry('check', 'Weld metal need not be checked for this load', 'AISC 360-22 Table J2.5',
    'Table J2.5 says this load need not be considered in the design of the weld: the entry is shown for the record, applicable is false and its numbers are zero.',
    'Nothing to change; check the members themselves for this load.'),
  GROOVE_BASE_METAL_EXEMPT: entry('check', 'Base metal need not be checked for this load', 'AISC 360-22 Table J2.5',
    'Table J2.5 says this load need not be considered in the design of the welded joint: the entry is shown for the record, applicable is false and its numbers are zero.',
    'Nothing to change; check the members themselves for this load.'),
  PLUG_SLOT_WELD_METAL: entry('check', 'Plug or slot weld metal strength', 'AISC 360-22 Table J2.5',
    'Shear of the plug or slot weld metal in the plane of the faying surface, Rn = 0.60·FEXX·Awe with Awe the nominal area of the holes or slots in that plane.',
    'Use more or larger plugs or slots (within the size limits), or a stronger electrode if the base metal allows it.'),
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
  // groove welds (PJP and CJP)
  PJP_MIN_THROAT: entry('limit', 'Minimum effective throat of a PJP groove weld', 'AISC 360-22 Table J2.3',
    'The effective throat of a PJP (or flare) groove weld, on one side, is less than the minimum for the thinner part joined.',
    'Deepen the groove, or use a process and position with no throat deduction.'),
  PJP_THROAT_MAX: entry('limit', 'PJP effective throat not more than the thinner part', 'AISC 360-22 §J2.1a',
    'The effective throat of the PJP groove weld (both sides together) exceeds the thinner part joined, the throat of a CJP groove weld in the same joint.',
    'Reduce the groove depth, or design the joint as a CJP groove weld.'),
  GROOVE_DEPTH_MAX: entry('limit', 'Groove depth not more than the prepared part', 'AISC 360-22 §J2.1a',
    'The groove depth (both sides together) exceeds the thickness of the part the groove is cut in.',
    'Reduce the groove depth, or name the prepared part with groove.part.'),
  CJP_FILLER_MATCHING: entry('limit', 'CJP filler metal strength level', 'AISC 360-22 Table J2.5',
    'The electrode is below the filler-metal strength Table J2.5 requires for a CJP groove weld under this load: matching for tension normal to the axis and for shear, at most one strength level (10 ksi, 70 MPa) below matching for compression normal to the axis.',
    'Use matching filler metal for the weaker part joined.'),
  PLUG_HOLE_DIAMETER_MIN: entry('limit', 'Minimum plug hole diameter', 'AISC 360-22 §J2.3b',
    'The plug hole is smaller than the thickness of the part containing it plus 5/16 in (8 mm), rounded up to the next odd 1/16 in (even mm).',
    'Enlarge the hole to at least the required diameter (the answer gives the allowed range).'),
  PLUG_HOLE_DIAMETER_MAX: entry('limit', 'Maximum plug hole diameter', 'AISC 360-22 §J2.3b',
    'The plug hole is larger than the minimum diameter plus 1/8 in (3 mm) or 2-1/4 times the depth of fill, whichever is larger.',
    'Use a smaller hole within the allowed range, or more plugs.'),
  PLUG_SPACING: entry('limit', 'Minimum plug spacing', 'AISC 360-22 §J2.3b',
    'Plug welds are closer centre to centre than 4 times the hole diameter.',
    'Space the plugs further apart or use fewer, larger plugs.'),
  SLOT_LENGTH_MAX: entry('limit', 'Maximum slot length', 'AISC 360-22 §J2.3b',
    'The slot is longer than 10 times the depth of fill.',
    'Use shorter slots, more of them, or a deeper fill where the part is thicker than 5/8 in (16 mm).'),
  SLOT_WIDTH_MIN: entry('limit', 'Minimum slot width', 'AISC 360-22 §J2.3b',
    'The slot is narrower than the thickness of the part containing it plus 5/16 in (8 mm), rounded up to the next odd 1/16 in (even mm).',
    'Widen the slot to at least the required width (the answer gives the allowed range).'),
  SLOT_WIDTH_MAX: entry('limit', 'Maximum slot width', 'AISC 360-22 §J2.3b',
    'The slot is wider than 2-1/4 times the depth of fill.',
    'Use a narrower slot, or a deeper fill where the part is thicker than 5/8 in (16 mm).'),
  SLOT_END_RADIUS: entry('limit', 'Minimum corner radius at a slot end', 'AISC 360-22 §J2.3b',
    'A slot end with rounded corners has a radius smaller than the thickness of the part containing the slot (semicircular ends and ends run out to the edge need no check).',
    'Round the corners to at least the part thickness, or make the end semicircular.'),
  SLOT_SPACING_ACROSS: entry('limit', 'Minimum spacing of lines of slots', 'AISC 360-22 §J2.3b',
    'Lines of slot welds are closer, transverse to their length, than 4 times the slot width.',
    'Space the lines of slots further apart.'),
  SLOT_SPACING_ALONG: entry('limit', 'Minimum spacing of slots along a line', 'AISC 360-22 §J2.3b',
    'Slots on one line are closer centre to centre than 2 times the slot length.',
    'Space the slots further apart along the line, or use fewer, longer slots within the length limit.'),
  PLUG_SLOT_FILL_DEPTH: entry('limit', 'Depth of fill of a plug or slot weld', 'AISC 360-22 §J2.3b',
    'The fill is shallower than the rule asks: the full thickness of a part up to 5/8 in (16 mm); at least half the thickness and at least 5/8 in (16 mm) in a thicker part.',
    'Specify the required depth of fill.'),
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
  // groove welds (PJP and CJP)
  PJP_CYCLIC_TENSION: entry('warning', 'PJP in tension normal to its axis under cyclic load', '',
    'The unfused root of a PJP groove weld loaded in tension normal to its axis acts as a crack under repeated load; fatigue is outside these checks.',
    'Use a CJP groove weld, or check fatigue separately.'),
  PJP_THROAT_DEDUCTION_AVOIDABLE: entry('warning', 'Avoidable throat deduction', 'AISC 360-22 Table J2.1',
    'The effective throat was reduced by 1/8 in (3 mm) for this process and position, while another process or position gives the full groove depth for the same groove.',
    'Ask the fabricator whether the process or position named in the message can be used.'),
  FLARE_RADIUS_ASSUMED: entry('warning', 'Flare radius assumed as 2t of the HSS', 'AISC 360-22 Table J2.2',
    'No radius of the joint surface was given, so the flare groove throat used R = 2t of the HSS wall.',
    'Give groove.radius when the actual corner radius is known.'),
  FLARE_BEVEL_RADIUS_SMALL: entry('warning', 'Flare bevel radius below 3/8 in (10 mm)', 'AISC 360-22 Table J2.2',
    'For a flare bevel groove with a radius below 3/8 in (10 mm) the table provides for a reinforcing fillet weld on a joint filled flush only.',
    'Design the joint as a fillet weld on the joint filled flush.'),
  QUALIFIED_THROAT_USED: entry('warning', 'Effective throat from procedure qualification', 'AISC 360-22 §J2.1a',
    'The effective throat given in the request, established by qualification tests of the welding procedure, was used instead of the prequalified throat.',
    'Keep the qualification record with the calculation; without it use the prequalified throat.'),
  GROOVE_LOAD_CASE_EXEMPT: entry('warning', 'Load need not be checked on the weld', 'AISC 360-22 Table J2.5',
    'For this load case Table J2.5 says the stress need not be considered in the design of the welds; the strength entries are shown with applicable false and the status reflects the detailing limits.',
    'Check the members for this load; make sure the parts are held in place.'),
  CJP_INSPECTION: entry('warning', 'CJP inspection', '',
    'A CJP groove weld is usually specified with ultrasonic or radiographic testing besides visual inspection; the strength assumes a sound, fully fused weld.',
    'Specify the nondestructive testing on the drawings where the project requires it.'),
  CJP_NOTCH_TOUGH_FILLER: entry('warning', 'Notch-tough filler metal required', 'AISC 360-22 §J2.6',
    'A CJP groove weld in a T- or corner joint with backing left in place, loaded in tension normal to its axis, needs filler metal with a specified notch toughness.',
    'Specify notch-tough filler metal, or remove the backing.'),
  PLUG_SLOT_TENSION: entry('warning', 'Plug or slot welds asked to carry tension', 'AISC 360-22 §J2.3b',
    'The request gives a force normal to the faying surface; plug and slot welds are for shear in the faying plane (and to hold lapped parts together), so no tension strength is reported.',
    'Carry the tension with fillet or groove welds, or bolts, and keep the plug or slot welds for shear.'),
  PLUG_SLOT_FILL_ASSUMED: entry('warning', 'Depth of fill assumed', 'AISC 360-22 §J2.3b',
    'No depth of fill was given, so the least depth the rule allows was used in the limits that depend on it.',
    'Give fill as specified on the drawings.'),
  SLOT_NO_COMPLIANT_WIDTH: entry('warning', 'No slot width satisfies both width limits', 'AISC 360-22 §J2.3b',
    'For this part thickness and depth of fill the least slot width exceeds the largest, so no slot can satisfy both limits.',
    'Use plug welds, a thicker part with a deeper fill, or another kind of weld.'),
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
  END_LOADED_NOT_LONGITUDINAL: entry('warning', 'End-loaded flag on a weld that is not longitudinal', 'AISC 360-22 §J2.2b',
    'A weld marked end-loaded is not loaded along its axis; the end-loaded length reduction applies to longitudinal welds only, so it was not applied.',
    'Mark only the longitudinal welds at the end of an axially loaded member as end-loaded.'),
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
  // groove welds (PJP and CJP)
  PJP_NO_PREQUALIFIED_THROAT: entry('error', 'No prequalified effective throat', '',
    'The welding process, position and groove type have no effective throat in Table J2.1 (or Table J2.2 for flare grooves), so the throat cannot be assumed.',
    'Change the process, position or groove type, or give groove.qualifiedThroat established by procedure qualification tests.'),
  PJP_GROOVE_TOO_SHALLOW: entry('error', 'Groove too shallow for an effective throat', '',
    'After the throat deduction of Table J2.1 the groove has no effective throat left.',
    'Deepen the groove, or use a process and position with no throat deduction.'),
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
