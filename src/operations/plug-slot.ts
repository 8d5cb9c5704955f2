/** POST /v1/plug-slot/check: the contract and its mapping to the engine. */
import { Type, type Static } from 'typebox';
import { checkPlugSlot, type HolePattern, type PlugSlotRequest, type SlotEnd } from '../engine/plug-slot.js';
import type { ElectrodeSpec, SteelSpec } from '../engine/materials.js';
import { Electrode, Envelope, Id, Length, Method, SheetFields, Steel, StringEnum, Units } from '../schemas/common.js';
import { RequestFieldError, envelope, length, type Operation } from './shared.js';

const SLOT_ENDS = ['semicircular', 'rounded', 'to-edge'] as const;
const SlotEndShape = StringEnum(SLOT_ENDS, {
  description: 'semicircular; rounded: square end with its corners rounded to hole.radius; to-edge: the end runs out to the edge of the part.',
});

export const PlugSlotHole = Type.Object(
  {
    shape: StringEnum(['plug', 'slot'] as const, { description: 'plug: round holes (give diameter); slot: elongated holes (give length and width).' }),
    diameter: Type.Optional(Length('Plug: hole diameter at the faying surface.')),
    length: Type.Optional(Length('Slot: overall length, end to end (to the edge of the part for an end that runs out to it).')),
    width: Type.Optional(Length('Slot: width.')),
    ends: Type.Optional(
      Type.Union([SlotEndShape, Type.Array(SlotEndShape, { minItems: 2, maxItems: 2 })], {
        description: 'Slot: shape of both ends, or [first end, second end]. Default semicircular.',
      }),
    ),
    radius: Type.Optional(Length('Slot: corner radius of ends with rounded corners (required with rounded ends, not allowed otherwise).')),
    count: Type.Optional(Type.Integer({ minimum: 1, maximum: 1000, description: 'Number of identical plugs or slots in the pattern. Default 1.' })),
    spacing: Type.Optional(Length('Centre-to-centre spacing along a row of plugs, or of slots along their line. Required (or spacingAcross) when count > 1.')),
    spacingAcross: Type.Optional(Length('Centre-to-centre spacing between rows of plugs, or between lines of slots transverse to their length.')),
  },
  { additionalProperties: false, description: 'The plug holes or slots, all alike, in the part that has hasHole: true.' },
);

export const PlugSlotPart = Type.Object(
  {
    thickness: Length('Thickness of the part.'),
    steel: Steel,
    hasHole: Type.Optional(Type.Boolean({ description: 'This part contains the holes or slots (exactly one of the two parts). Default false.' })),
  },
  { additionalProperties: false },
);

export const PlugSlotLoad = Type.Object(
  {
    force: Type.Number({ minimum: 0, maximum: 1e9, description: 'Required shear strength of the whole pattern in the faying plane, kip or kN (factored for LRFD, service for ASD).' }),
    tension: Type.Optional(
      Type.Number({ minimum: 0, maximum: 1e9, description: 'Force normal to the faying surface, kip or kN. Plug and slot welds are not for tension: a value above 0 brings a warning, not a strength.' }),
    ),
  },
  { additionalProperties: false, description: 'The demand. Omit it to get available strengths only.' },
);

export const PlugSlotCheckBody = Type.Object(
  {
    id: Type.Optional(Id),
    method: Method,
    units: Type.Optional(Units),
    sheet: Type.Optional(SheetFields),
    electrode: Electrode,
    hole: PlugSlotHole,
    fill: Type.Optional(Length('Depth of fill of each hole or slot (the thickness of the weld). Default: the least the rule allows.')),
    load: Type.Optional(PlugSlotLoad),
    parts: Type.Array(PlugSlotPart, { minItems: 2, maxItems: 2, description: 'The two lapped parts; exactly one has hasHole: true.' }),
  },
  { additionalProperties: false, $id: 'PlugSlotCheckRequest', title: 'PlugSlotCheckRequest' },
);
export type PlugSlotCheckBody = Static<typeof PlugSlotCheckBody>;

const N = Type.Number();
export const PlugSlotValues = Type.Object(
  {
    shape: StringEnum(['plug', 'slot'] as const),
    fexx: N,
    count: Type.Integer(),
    holePart: Type.Integer({ description: 'Index into parts[] of the part with the holes or slots.' }),
    thickness: Type.Number({ description: 'Thickness t of the part with the holes, the t of the limits.' }),
    fill: Type.Number({ description: 'Depth of fill used (given, or the least allowed).' }),
    fillGiven: Type.Boolean(),
    fillRequired: Type.Number({ description: 'Least depth of fill the rule allows for this part.' }),
    area: Type.Number({ description: 'Effective area of one plug or slot in the faying plane.' }),
    effectiveArea: Type.Number({ description: 'Effective area of the whole pattern, count × area.' }),
    perimeter: Type.Number({ description: 'Perimeter of the wall of one hole or slot.' }),
    allowed: Type.Object(
      {
        dimension: StringEnum(['diameter', 'width'] as const),
        min: Type.Number({ description: 'Least hole diameter or slot width for this part.' }),
        max: Type.Number({ description: 'Largest hole diameter or slot width for this part and fill.' }),
        lengthMax: Type.Optional(Type.Number({ description: 'Slot: largest length for this fill.' })),
      },
      { additionalProperties: false, description: 'The sizes the limits allow, to pick a compliant size from.' },
    ),
    spacingRequired: Type.Object(
      { along: N, across: N },
      { additionalProperties: false, description: 'Least centre-to-centre spacings along and across.' },
    ),
    weldMetalNominal: N,
    parts: Type.Array(
      Type.Object(
        {
          thickness: N,
          fy: N,
          fu: N,
          plane: StringEnum(['hole-wall', 'faying-surface'] as const, {
            description: 'Where the part meets the weld and is checked in shear: the fused wall of the holes (perimeter × fill) or the faying surface (the welds\' effective area).',
          }),
          area: Type.Number({ description: 'Shear area of that plane for the whole pattern.' }),
        },
        { additionalProperties: false },
      ),
    ),
  },
  { additionalProperties: false },
);

export const PlugSlotCheckResponse = Envelope('PlugSlotCheckResult', PlugSlotValues);

function forbid(value: unknown, pointer: string, why: string): void {
  if (value !== undefined) throw new RequestFieldError(pointer, why);
}

function need<T>(value: T | undefined, pointer: string, why: string): T {
  if (value === undefined) throw new RequestFieldError(pointer, why);
  return value;
}

export function toPlugSlotRequest(body: PlugSlotCheckBody): PlugSlotRequest {
  const units = body.units ?? 'imperial';
  const h = body.hole;
  const count = h.count ?? 1;
  const spacing = h.spacing === undefined ? null : length(h.spacing, units, '/hole/spacing');
  const spacingAcross = h.spacingAcross === undefined ? null : length(h.spacingAcross, units, '/hole/spacingAcross');
  if (count > 1 && spacing === null && spacingAcross === null) {
    throw new RequestFieldError('/hole/spacing', `A pattern of ${count} needs its centre-to-centre spacing (spacing, spacingAcross, or both).`);
  }
  let hole: HolePattern;
  if (h.shape === 'plug') {
    for (const f of ['length', 'width', 'ends', 'radius'] as const) forbid(h[f], `/hole/${f}`, `A plug has no ${f}; give its diameter.`);
    hole = { shape: 'plug', diameter: length(need(h.diameter, '/hole/diameter', 'A plug needs its hole diameter.'), units, '/hole/diameter'), count, spacing, spacingAcross };
  } else {
    forbid(h.diameter, '/hole/diameter', 'A slot has no diameter; give its length and width.');
    const ends: [SlotEnd, SlotEnd] = h.ends === undefined ? ['semicircular', 'semicircular'] : typeof h.ends === 'string' ? [h.ends, h.ends] : [h.ends[0]!, h.ends[1]!];
    const rounded = ends.includes('rounded');
    if (!rounded) forbid(h.radius, '/hole/radius', 'A corner radius belongs to rounded ends only.');
    const radius = rounded ? length(need(h.radius, '/hole/radius', 'Rounded ends need their corner radius.'), units, '/hole/radius') : null;
    hole = {
      shape: 'slot',
      length: length(need(h.length, '/hole/length', 'A slot needs its length.'), units, '/hole/length'),
      width: length(need(h.width, '/hole/width', 'A slot needs its width.'), units, '/hole/width'),
      ends,
      radius,
      count,
      spacing,
      spacingAcross,
    };
  }
  const holed = body.parts.flatMap((p, i) => (p.hasHole === true ? [i] : []));
  if (holed.length === 0) throw new RequestFieldError('/parts/0/hasHole', 'Mark the part that contains the holes or slots with hasHole: true.');
  if (holed.length > 1) throw new RequestFieldError(`/parts/${holed[1]}/hasHole`, 'Only one of the two lapped parts contains the holes or slots.');
  return {
    method: body.method,
    units,
    electrode: body.electrode as ElectrodeSpec,
    hole,
    fill: body.fill === undefined ? null : length(body.fill, units, '/fill'),
    parts: body.parts.map((p, i) => ({ thickness: length(p.thickness, units, `/parts/${i}/thickness`), steel: p.steel as SteelSpec, hasHole: p.hasHole === true })),
    demand: body.load ? body.load.force : null,
    tension: body.load?.tension ?? null,
  };
}

export const plugSlotCheck: Operation<PlugSlotCheckBody> = {
  kind: 'plug-slot',
  path: '/v1/plug-slot/check',
  summary: 'Check plug and slot welds and the lapped parts',
  description:
    'Plug and slot welds in a lap joint (AISC 360-22 §J2.3): weld metal shear on the nominal area of the holes or slots in the faying plane (Table J2.5), ' +
    'shear of each lapped part where it meets the weld (§J4.2: the part with the holes on the fused wall of the holes, the other part on the faying surface), ' +
    'and every geometric limit of §J2.3b with the allowed range of hole diameter or slot width for the given part.',
  body: PlugSlotCheckBody,
  response: PlugSlotCheckResponse,
  examples: {
    coverPlatePlugs: {
      summary: 'WS-CP2: four 13/16 in E70 plug welds through a 1/2 in A36 cover plate onto a 5/8 in A36 plate, LRFD',
      value: {
        id: 'WS-CP2',
        method: 'LRFD',
        units: 'imperial',
        electrode: 'E70',
        hole: { shape: 'plug', diameter: '13/16', count: 4, spacing: 4 },
        fill: 0.5,
        load: { force: 30 },
        parts: [
          { thickness: 0.5, steel: 'A36', hasHole: true },
          { thickness: 0.625, steel: 'A36' },
        ],
      },
    },
    stiffenerSlots: {
      summary: 'WS-R08: two 20 × 80 mm slots with semicircular ends in a 12 mm S355 stiffener lapped on a 15 mm plate, ASD',
      value: {
        id: 'WS-R08',
        method: 'ASD',
        units: 'metric',
        electrode: 'E49',
        hole: { shape: 'slot', length: 80, width: 20, ends: 'semicircular', count: 2, spacing: 200 },
        fill: 12,
        load: { force: 150 },
        parts: [
          { thickness: 12, steel: 'S355', hasHole: true },
          { thickness: 15, steel: 'S355' },
        ],
      },
    },
  },
  run(body) {
    return envelope(body, checkPlugSlot(toPlugSlotRequest(body)));
  },
};
