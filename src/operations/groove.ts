/**
 * POST /v1/groove/pjp/check and POST /v1/groove/cjp/check: the contracts and their mapping to
 * the engine (src/engine/groove.ts).
 *
 * Two-sided PJP grooves: `sides: 2` with one `depth` for both sides, or `depths: [a, b]` for
 * sides of different depth (sides is then 2 by default); the throats of the sides are summed.
 * A throat qualified by procedure tests is given the same way: `qualifiedThroat` (each side) or
 * `qualifiedThroats: [a, b]`.
 */
import { Type, type Static } from 'typebox';
import { checkCjp, checkPjp, type CjpRequest, type PjpRequest } from '../engine/groove.js';
import type { ElectrodeSpec, SteelSpec } from '../engine/materials.js';
import { GROOVE_LOAD_CASES, GROOVE_TYPES, WELD_POSITIONS, WELD_PROCESSES, isFlare, positionMatters } from '../engine/provisions/groove.js';
import { Electrode, Envelope, Id, Length, Method, SheetFields, Steel, StringEnum, Units } from '../schemas/common.js';
import { RequestFieldError, envelope, length, type Operation } from './shared.js';

const LoadCase = StringEnum(GROOVE_LOAD_CASES, {
  description:
    'Load on the weld (AISC 360-22 Table J2.5): tension-normal (tension normal to the weld axis); compression-column-bearing (column on a base plate or column splice finished to bear, §J1.4a); ' +
    'compression-member-bearing (other members finished to bear, §J1.4b); compression-not-bearing; parallel (tension or compression parallel to the weld axis); shear.',
});
const Force = Type.Number({ minimum: 0, maximum: 1e9, description: 'Required strength of the joint, kip or kN (factored for LRFD, service for ASD). Omit it to get available strengths only.' });

export const PjpGroove = Type.Object(
  {
    type: StringEnum(GROOVE_TYPES, { description: 'Groove type: J, U, V-60 (60-degree V), bevel-60, bevel-45 (single bevel), flare-bevel, flare-V.' }),
    process: StringEnum(WELD_PROCESSES, { description: 'Welding process. FCAW-G (gas shielded) and FCAW-S (self shielded) matter for flare grooves (Table J2.2); plain FCAW is enough for Table J2.1.' }),
    position: Type.Optional(StringEnum(WELD_POSITIONS, { description: 'Welding position. Needed where Table J2.1 depends on it (SAW; GMAW or FCAW on a 45-degree bevel).' })),
    sides: Type.Optional(Type.Integer({ minimum: 1, maximum: 2, description: '1: groove from one face; 2: grooves from both faces, throats summed. Default 1, or 2 when depths is given.' })),
    depth: Type.Optional(Length('Groove depth S of each side. Not used for flare grooves.')),
    depths: Type.Optional(Type.Array(Length('Groove depth S of one side.'), { minItems: 2, maxItems: 2, description: 'Groove depths of the two sides when they differ.' })),
    radius: Type.Optional(Length('Flare grooves: radius R of the joint surface. Omitted: 2t of the part marked hss (Table J2.2).')),
    qualifiedThroat: Type.Optional(Length('Effective throat of each side established by procedure qualification tests (§J2.1a); used instead of the prequalified throat, and required where the tables give none.')),
    qualifiedThroats: Type.Optional(Type.Array(Length('Qualified effective throat of one side.'), { minItems: 2, maxItems: 2, description: 'Qualified throats of the two sides when they differ.' })),
    part: Type.Optional(Type.Integer({ minimum: 0, maximum: 1, description: 'Index of the part the groove is cut in, for the groove-depth limit. Default: the thinner part.' })),
  },
  { additionalProperties: false, description: 'The groove: type, process, position and depth (or radius for flare grooves).' },
);

export const PjpPart = Type.Object(
  {
    thickness: Length('Thickness of the part.'),
    steel: Steel,
    hss: Type.Optional(Type.Boolean({ description: 'The part is an HSS wall; with a flare groove and no radius, R = 2t of this part. Default false.' })),
  },
  { additionalProperties: false },
);

export const PjpLoad = Type.Object(
  {
    case: LoadCase,
    force: Type.Optional(Force),
    cyclic: Type.Optional(Type.Boolean({ description: 'The load is repeated (fatigue). Default false.' })),
  },
  { additionalProperties: false },
);

export const PjpCheckBody = Type.Object(
  {
    id: Type.Optional(Id),
    method: Method,
    units: Type.Optional(Units),
    sheet: Type.Optional(SheetFields),
    electrode: Electrode,
    groove: PjpGroove,
    length: Length('Length of the weld.'),
    load: PjpLoad,
    parts: Type.Array(PjpPart, { minItems: 1, maxItems: 2, description: 'The parts joined.' }),
  },
  { additionalProperties: false, $id: 'PjpCheckRequest', title: 'PjpCheckRequest' },
);
export type PjpCheckBody = Static<typeof PjpCheckBody>;

const N = Type.Number();
const NullableNumber = (description: string) => Type.Union([Type.Number(), Type.Null()], { description });
const GoverningSide = StringEnum(['weld-metal', 'base-metal', 'none'] as const, { description: 'Which side of the joint governs; none where Table J2.5 exempts the load.' });

export const PjpValues = Type.Object(
  {
    fexx: N,
    loadCase: LoadCase,
    throatSource: StringEnum(['Table J2.1', 'Table J2.2', 'qualified'] as const, { description: 'Where the effective throat came from.' }),
    sides: Type.Array(
      Type.Object(
        {
          depth: NullableNumber('Groove depth S (null for flare grooves).'),
          prequalifiedThroat: NullableNumber('Throat from Table J2.1 or J2.2; null where the tables give none.'),
          deduction: Type.Number({ description: 'Deduction of Table J2.1 applied to this side.' }),
          throat: Type.Number({ description: 'Effective throat used for this side.' }),
        },
        { additionalProperties: false },
      ),
    ),
    throat: Type.Number({ description: 'Effective throat of the joint, sides summed.' }),
    radius: NullableNumber('Radius of the joint surface used for a flare groove.'),
    radiusAssumed: Type.Boolean({ description: 'true when R = 2t of the HSS was assumed.' }),
    length: N,
    area: Type.Number({ description: 'Effective area Awe = throat × length.' }),
    weldStress: NullableNumber('Fnw for the load case; null where the weld need not be checked.'),
    weldMetalNominal: NullableNumber('Rn of the weld metal.'),
    thinnerPart: N,
    minThroat: Type.Number({ description: 'Minimum effective throat for the thinner part (Table J2.3).' }),
    governingSide: GoverningSide,
    parts: Type.Array(
      Type.Object(
        { thickness: N, fy: N, fu: N, fusionArea: Type.Number({ description: 'Base-metal area at the fusion face: the sum over the sides of min(side throat, thickness) × length.' }) },
        { additionalProperties: false },
      ),
    ),
  },
  { additionalProperties: false },
);

export function toPjpRequest(body: PjpCheckBody): PjpRequest {
  const units = body.units ?? 'imperial';
  const g = body.groove;
  const flare = isFlare(g.type);
  if (g.depth !== undefined && g.depths !== undefined) throw new RequestFieldError('/groove/depths', 'Give depth (each side) or depths (two sides), not both.');
  if (g.qualifiedThroat !== undefined && g.qualifiedThroats !== undefined) throw new RequestFieldError('/groove/qualifiedThroats', 'Give qualifiedThroat (each side) or qualifiedThroats (two sides), not both.');
  const sides: 1 | 2 = g.sides === 2 || (g.sides === undefined && (g.depths !== undefined || g.qualifiedThroats !== undefined)) ? 2 : 1;
  if (sides === 1 && g.depths !== undefined) throw new RequestFieldError('/groove/depths', 'Two depths describe a two-sided groove: give sides 2, or one depth.');
  if (sides === 1 && g.qualifiedThroats !== undefined) throw new RequestFieldError('/groove/qualifiedThroats', 'Two throats describe a two-sided groove: give sides 2, or one qualifiedThroat.');

  const parts = body.parts.map((p, i) => ({ thickness: length(p.thickness, units, `/parts/${i}/thickness`), steel: p.steel as SteelSpec, hss: p.hss ?? false }));

  let depths: number[] | null = null;
  let radius: number | null = null;
  if (flare) {
    if (g.depth !== undefined || g.depths !== undefined) throw new RequestFieldError(g.depth !== undefined ? '/groove/depth' : '/groove/depths', 'A flare groove takes the radius of the joint surface (groove.radius), not a groove depth.');
    if (g.radius !== undefined) radius = length(g.radius, units, '/groove/radius');
    else if (!parts.some((p) => p.hss)) throw new RequestFieldError('/groove/radius', 'A flare groove needs groove.radius, or a part marked "hss": true so that R = 2t of its wall may be assumed.');
  } else {
    if (g.radius !== undefined) throw new RequestFieldError('/groove/radius', 'The radius is used only for flare-bevel and flare-V grooves.');
    if (g.depths !== undefined) depths = g.depths.map((d, i) => length(d, units, `/groove/depths/${i}`));
    else if (g.depth !== undefined) {
      const d = length(g.depth, units, '/groove/depth');
      depths = sides === 2 ? [d, d] : [d];
    } else throw new RequestFieldError('/groove/depth', `A ${g.type} groove needs its depth S (groove.depth, or groove.depths for two sides of different depth).`);
  }

  let qualifiedThroats: number[] | null = null;
  if (g.qualifiedThroats !== undefined) qualifiedThroats = g.qualifiedThroats.map((t, i) => length(t, units, `/groove/qualifiedThroats/${i}`));
  else if (g.qualifiedThroat !== undefined) {
    const t = length(g.qualifiedThroat, units, '/groove/qualifiedThroat');
    qualifiedThroats = sides === 2 ? [t, t] : [t];
  }

  if (!flare && g.position === undefined && qualifiedThroats === null && positionMatters(g.process, g.type)) {
    throw new RequestFieldError('/groove/position', `Table J2.1 gives a ${g.type} groove by ${g.process} a throat that depends on the welding position: give groove.position (flat, horizontal, vertical or overhead).`);
  }
  if (g.part !== undefined && g.part >= parts.length) throw new RequestFieldError('/groove/part', `There is no parts[${g.part}].`);

  return {
    method: body.method,
    units,
    electrode: body.electrode as ElectrodeSpec,
    groove: { type: g.type, process: g.process, position: g.position ?? null, sides, depths, radius, qualifiedThroats, part: g.part ?? null },
    length: length(body.length, units, '/length'),
    load: { case: body.load.case, cyclic: body.load.cyclic ?? false },
    demand: body.load.force ?? null,
    parts,
  };
}

export const pjpCheck: Operation<PjpCheckBody> = {
  kind: 'groove-pjp',
  path: '/v1/groove/pjp/check',
  summary: 'Check a partial-joint-penetration groove weld, flare grooves included',
  description:
    'Effective throat from AISC 360-22 Table J2.1 (process, position, groove type, groove depth) or Table J2.2 (flare-bevel and flare-V grooves, from the radius of the joint surface, 2t for an HSS when not given), ' +
    'or a throat qualified by procedure tests; weld metal and base metal at the fusion face for every load case of Table J2.5 (the lower governs; cases the table exempts are listed with applicable false); ' +
    'the minimum throat of Table J2.3, the throat against the thinner part and the groove depth against the prepared part. ' +
    'A process, position and groove with no prequalified throat is refused with PJP_NO_PREQUALIFIED_THROAT (422) unless groove.qualifiedThroat is given.',
  body: PjpCheckBody,
  response: Envelope('PjpCheckResult', PjpValues),
  examples: {
    bracketBevel: {
      summary: 'WS-C07: crane-runway bracket plate on a column flange, 45-degree single bevel 1/2 in deep, SMAW vertical, tension normal, ASD',
      value: {
        id: 'WS-C07',
        method: 'ASD',
        units: 'imperial',
        electrode: 'E70',
        groove: { type: 'bevel-45', depth: 0.5, process: 'SMAW', position: 'vertical', sides: 1 },
        length: 12,
        load: { case: 'tension-normal', force: 40 },
        parts: [
          { thickness: 0.75, steel: 'A992' },
          { thickness: 1.0, steel: 'A572-50' },
        ],
      },
    },
    hssFlare: {
      summary: 'WS-R03: HSS roof strut on a 1/2 in cap plate, flare-bevel groove by GMAW, R = 2t assumed, shear, LRFD',
      value: {
        id: 'WS-R03',
        method: 'LRFD',
        units: 'imperial',
        electrode: 'E70',
        groove: { type: 'flare-bevel', process: 'GMAW', position: 'horizontal', sides: 2 },
        length: 6,
        load: { case: 'shear', force: 30 },
        parts: [
          { thickness: 0.25, steel: 'A500-C-rect', hss: true },
          { thickness: 0.5, steel: 'A36' },
        ],
      },
    },
    metricDoubleV: {
      summary: 'WS-M02: metric double 60-degree V PJP in a 40 mm S355 strut splice, GMAW flat, compression not finished to bear, LRFD',
      value: {
        id: 'WS-M02',
        method: 'LRFD',
        units: 'metric',
        electrode: 'E49',
        groove: { type: 'V-60', depths: [12, 12], process: 'GMAW', position: 'flat' },
        length: 300,
        load: { case: 'compression-not-bearing', force: 2000 },
        parts: [
          { thickness: 40, steel: 'S355' },
          { thickness: 40, steel: 'S355' },
        ],
      },
    },
  },
  run(body) {
    return envelope(body, checkPjp(toPjpRequest(body)));
  },
};

// ------------------------------------------------------------------ CJP

export const CjpPart = Type.Object({ thickness: Length('Thickness of the part.'), steel: Steel }, { additionalProperties: false });

export const CjpLoad = Type.Object({ case: LoadCase, force: Type.Optional(Force) }, { additionalProperties: false });

export const CjpCheckBody = Type.Object(
  {
    id: Type.Optional(Id),
    method: Method,
    units: Type.Optional(Units),
    sheet: Type.Optional(SheetFields),
    electrode: Electrode,
    length: Length('Length of the weld.'),
    load: CjpLoad,
    parts: Type.Array(CjpPart, { minItems: 1, maxItems: 2, description: 'The parts joined; the effective throat is the thinner one.' }),
    joint: Type.Optional(StringEnum(['butt', 'T', 'corner'] as const, { description: 'Joint type, for the notch-toughness rule of §J2.6. Default butt.' })),
    backingLeftInPlace: Type.Optional(Type.Boolean({ description: 'Steel backing is left in place. Default false.' })),
  },
  { additionalProperties: false, $id: 'CjpCheckRequest', title: 'CjpCheckRequest' },
);
export type CjpCheckBody = Static<typeof CjpCheckBody>;

export const CjpValues = Type.Object(
  {
    fexx: N,
    loadCase: LoadCase,
    throat: Type.Number({ description: 'Effective throat: the thinner part joined (§J2.1a).' }),
    length: N,
    area: Type.Number({ description: 'Effective area: throat × length, used for the base metal of each part.' }),
    fillerRule: StringEnum(['matching', 'one-level-below-permitted', 'below-matching-permitted'] as const, { description: 'Filler-metal rule of Table J2.5 for the load case.' }),
    matchingFexx: Type.Number({ description: 'FEXX that matches the weaker part joined (0.95 × Fu).' }),
    fillerRequired: Type.Number({ description: 'Lowest FEXX the rule accepts for this load case.' }),
    governingSide: GoverningSide,
    parts: Type.Array(Type.Object({ thickness: N, fy: N, fu: N, area: N }, { additionalProperties: false })),
  },
  { additionalProperties: false },
);

export function toCjpRequest(body: CjpCheckBody): CjpRequest {
  const units = body.units ?? 'imperial';
  return {
    method: body.method,
    units,
    electrode: body.electrode as ElectrodeSpec,
    length: length(body.length, units, '/length'),
    load: { case: body.load.case },
    demand: body.load.force ?? null,
    parts: body.parts.map((p, i) => ({ thickness: length(p.thickness, units, `/parts/${i}/thickness`), steel: p.steel as SteelSpec })),
    joint: body.joint ?? 'butt',
    backingLeftInPlace: body.backingLeftInPlace ?? false,
  };
}

export const cjpCheck: Operation<CjpCheckBody> = {
  kind: 'groove-cjp',
  path: '/v1/groove/cjp/check',
  summary: 'Check a complete-joint-penetration groove weld',
  description:
    'The base metal governs a CJP groove weld (AISC 360-22 Table J2.5): tension yielding and rupture (§J4.1), compression (Eq. J4-6) or shear yielding and rupture (§J4.2) of each part on the effective area, ' +
    'the thinner part × the length; tension or compression parallel to the axis is listed as not applicable. The filler-metal rule of the load case is a limit: ' +
    'matching for tension normal to the axis and shear, up to one strength level below matching for compression.',
  body: CjpCheckBody,
  response: Envelope('CjpCheckResult', CjpValues),
  examples: {
    flangeSplice: {
      summary: 'WS-G04: CJP butt splice of a 3/4 in A572-50 girder flange to a 1 in flange plate, tension, LRFD',
      value: {
        id: 'WS-G04',
        method: 'LRFD',
        units: 'imperial',
        electrode: 'E70',
        length: 10,
        load: { case: 'tension-normal', force: 300 },
        parts: [
          { thickness: 0.75, steel: 'A572-50' },
          { thickness: 1.0, steel: 'A572-50' },
        ],
      },
    },
    metricColumnSplice: {
      summary: 'WS-C11: metric CJP column splice of 25 mm S355 flanges, compression, E43 one strength level below matching, ASD',
      value: {
        id: 'WS-C11',
        method: 'ASD',
        units: 'metric',
        electrode: 'E43',
        length: 250,
        load: { case: 'compression-column-bearing', force: 900 },
        parts: [
          { thickness: 25, steel: 'S355' },
          { thickness: 25, steel: 'S355' },
        ],
      },
    },
  },
  run(body) {
    return envelope(body, checkCjp(toCjpRequest(body)));
  },
};
