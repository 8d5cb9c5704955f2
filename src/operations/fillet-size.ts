/** POST /v1/fillet/size: the economical fillet weld for a demand, its full check and ranked alternatives. */
import { Type, type Static } from 'typebox';
import type { ElectrodeSpec, SteelSpec } from '../engine/materials.js';
import { sizeFillet, type SizingRequest } from '../engine/sizing.js';
import { CheckCode, Electrode, Envelope, Id, Length, Method, SheetFields, StringEnum, Units } from '../schemas/common.js';
import { FilletPart, FilletValues } from './fillet.js';
import { RequestFieldError, envelope, length, type Operation } from './shared.js';

const MAX_FORCE = 1e9;

export const SizeLoad = Type.Object(
  {
    force: Type.Number({ exclusiveMinimum: 0, maximum: MAX_FORCE, description: 'Required strength of the whole joint, kip or kN (factored for LRFD, service for ASD).' }),
    angle: Type.Optional(Type.Number({ minimum: 0, maximum: 90, description: 'Angle between the load and the sized lines, degrees: 0 longitudinal (default), 90 transverse.' })),
  },
  { additionalProperties: false, description: 'The demand and its direction relative to the sized lines.' },
);

export const AvailableLength = Type.Object(
  {
    fixed: Type.Optional(Length('Each sized line must be exactly this long (the continuous weld has this length; intermittent segments are spread over it).')),
    max: Type.Optional(Length('Each sized line may be at most this long.')),
  },
  { additionalProperties: false, description: 'The length available for each sized line: give fixed or max.' },
);

export const SizePreferences = Type.Object(
  {
    maxSize: Type.Optional(Length('Largest fillet size to consider. Default 1 in (25 mm); edge parts limit it further.')),
    singlePass: Type.Optional(Type.Boolean({ description: 'Consider only sizes usually made in one pass (up to 5/16 in, 8 mm; common practice). Default false.' })),
    sizeStep: Type.Optional(Length('Increment of the sizes searched. Default 1/16 in (1 mm).')),
    lengthStep: Type.Optional(Length('Increment of the lengths, segment lengths and pitches searched. Default 1/4 in (5 mm).')),
    intermittent: Type.Optional(Type.Boolean({ description: 'Also search intermittent welds (segments at a pitch along each line). Default false.' })),
    minSegment: Type.Optional(Length('With intermittent: shortest segment to consider, besides the §J2.2b minimum of max(4w, 1-1/2 in (38 mm)).')),
    alternatives: Type.Optional(Type.Integer({ minimum: 0, maximum: 50, description: 'How many ranked alternatives to return besides the recommendation. Default 8.' })),
  },
  { additionalProperties: false, description: 'How to search.' },
);

export const FilletSizeBody = Type.Object(
  {
    id: Type.Optional(Id),
    method: Method,
    units: Type.Optional(Units),
    sheet: Type.Optional(SheetFields),
    electrode: Type.Union([Electrode, StringEnum(['match'] as const, { description: 'Choose the matching classification for the strongest part.' })], {
      description: 'Filler metal by classification or FEXX, or "match" to choose the weakest catalogue classification of the unit system that matches the strongest part.',
    }),
    load: SizeLoad,
    lines: Type.Optional(Type.Integer({ minimum: 1, maximum: 1000, description: 'Number of identical sized lines. Default 1.' })),
    length: AvailableLength,
    transverse: Type.Optional(
      Type.Object(
        {
          lines: Type.Optional(Type.Integer({ minimum: 1, maximum: 1000, description: 'Number of transverse lines. Default 1.' })),
          length: Length('Length of each transverse line (for example the width of the part).'),
        },
        {
          additionalProperties: false,
          description: 'Transverse lines of a given length welded with the same size as the sized lines; with load.angle 0 the group is one of longitudinal and transverse lines (Eq. J2-6).',
        },
      ),
    ),
    endLoaded: Type.Optional(Type.Boolean({ description: 'The sized lines are longitudinal welds at the end of an axially loaded member (length reduction of Eq. J2-1). Default false.' })),
    parts: Type.Array(FilletPart, { minItems: 1, maxItems: 4, description: 'The connected parts; the thinner one sets the minimum size, an edge part the maximum.' }),
    directionalIncrease: Type.Optional(Type.Boolean({ description: 'Use the directional increase (Eq. J2-5, J2-6) where permitted. Default true.' })),
    preferences: Type.Optional(SizePreferences),
  },
  { additionalProperties: false, $id: 'FilletSizeRequest', title: 'FilletSizeRequest' },
);
export type FilletSizeBody = Static<typeof FilletSizeBody>;

const N = Type.Number();
const NullableNumber = (description: string) => Type.Union([Type.Number(), Type.Null()], { description });
const Layout = StringEnum(['continuous', 'intermittent'] as const, { description: 'continuous, or intermittent segments at a pitch.' });

const sizedWeldProps = {
  rank: Type.Integer({ description: '1 for the recommendation, 2... for the alternatives in order; 0 for the weld shown when nothing complies.' }),
  size: Type.Number({ description: 'Leg size w.' }),
  length: Type.Number({ description: 'Length of one line (continuous) or of one segment (intermittent), as /v1/fillet/check takes it.' }),
  layout: Layout,
  segments: Type.Integer({ description: 'Segments per line (1 when continuous).' }),
  pitch: NullableNumber('Centre-to-centre spacing of the segments; null when continuous.'),
  span: Type.Number({ description: 'Length of line the weld occupies.' }),
  lines: Type.Integer({ description: 'Number of sized lines.' }),
  totalLength: Type.Number({ description: 'Deposited length of all lines, transverse ones included.' }),
  volume: Type.Number({ description: 'Weld metal volume, w²/2 × totalLength (in³ or mm³).' }),
  passes: Type.Integer({ description: 'Estimated passes: 1 up to 5/16 in (8 mm), above it the deposit area over that of a single-pass fillet, rounded up (common practice, no source).' }),
  utilization: N,
  governing: CheckCode,
  governingPart: Type.Union([Type.Integer(), Type.Null()], { description: 'Part of a governing base-metal check; null for the weld metal.' }),
};

export const SizedWeld = Type.Object(sizedWeldProps, { additionalProperties: false });

const CheckWeld = Type.Object(
  {
    size: N,
    length: N,
    angle: N,
    count: Type.Integer(),
    endLoaded: Type.Boolean(),
    intermittent: Type.Optional(Type.Object({ segments: Type.Integer(), pitch: N }, { additionalProperties: false })),
  },
  { additionalProperties: false },
);

const Recommended = Type.Object(
  {
    ...sizedWeldProps,
    electrode: Type.Object(
      {
        name: Type.Union([Type.String(), Type.Null()]),
        fexx: N,
        chosen: Type.Boolean({ description: 'true when the request asked for the matching electrode.' }),
      },
      { additionalProperties: false },
    ),
    welds: Type.Array(CheckWeld, { description: 'The recommended weld lines, ready for the welds field of POST /v1/fillet/check.' }),
  },
  { additionalProperties: false },
);

const Unblock = Type.Object(
  {
    change: StringEnum(['thicker-part', 'longer-weld', 'stronger-electrode', 'larger-size', 'size-step'] as const),
    message: Type.String(),
    part: Type.Union([Type.Integer(), Type.Null()], { description: 'With thicker-part: the part to change.' }),
    value: Type.Number({ description: 'The new thickness, length per line, FEXX, largest size or size step.' }),
    electrode: Type.Union([Type.String(), Type.Null()], { description: 'With stronger-electrode: the classification.' }),
    result: Type.Union(
      [Type.Object({ size: N, length: N, layout: Layout, segments: Type.Integer(), pitch: NullableNumber('Pitch, or null when continuous.') }, { additionalProperties: false }), Type.Null()],
      { description: 'The weld the search recommends with this change alone; null when another block remains.' },
    ),
  },
  { additionalProperties: false },
);

export const FilletSizeValues = Type.Object(
  {
    recommended: Type.Union([Recommended, Type.Null()], { description: 'The cheapest compliant weld; null when none complies.' }),
    alternatives: Type.Array(SizedWeld, { description: 'Other compliant welds, ranked: the cheapest continuous and the cheapest intermittent weld of each size.' }),
    closest: Type.Union([SizedWeld, Type.Null()], { description: 'When nothing complies: the strongest weld searched, whose checks the answer shows.' }),
    blocking: Type.Union(
      [
        Type.Object(
          {
            code: StringEnum(['SIZING_SIZE_LIMITS_CROSS', 'SIZING_BASE_METAL_TOO_THIN', 'SIZING_LENGTH_UNAVAILABLE', 'SIZING_NO_COMPLIANT_WELD'] as const),
            message: Type.String(),
            unblock: Type.Array(Unblock, { description: 'Changes that clear the block, each checked by searching again.' }),
          },
          { additionalProperties: false },
        ),
        Type.Null(),
      ],
      { description: 'When nothing complies: what blocks it and the changes that unblock it.' },
    ),
    search: Type.Object(
      {
        sizeMinRule: Type.Number({ description: 'Minimum size for the thinner part (AISC 360-22 Table J2.4).' }),
        sizeMaxRule: Type.Number({ description: 'Largest size allowed.' }),
        sizeMaxBy: StringEnum(['maxSize', 'edge', 'singlePass'] as const, { description: 'What set the largest size.' }),
        sizeStep: N,
        sizeCount: Type.Integer(),
        lengthStep: N,
        lengthMode: StringEnum(['fixed', 'max'] as const),
        span: Type.Number({ description: 'Available length of each sized line.' }),
        intermittent: Type.Boolean(),
        gridSize: Type.Integer({ description: 'Candidates in the grid.' }),
        evaluated: Type.Integer({ description: 'Candidates checked; the rest were pruned as provably not cheaper.' }),
      },
      { additionalProperties: false, description: 'The grid searched.' },
    ),
    check: FilletValues,
  },
  { additionalProperties: false },
);

export const FilletSizeResponse = Envelope('FilletSizeResult', FilletSizeValues);

export function toSizingRequest(body: FilletSizeBody): SizingRequest {
  const units = body.units ?? 'imperial';
  const { fixed, max } = body.length;
  if (fixed !== undefined && max !== undefined) throw new RequestFieldError('/length/max', 'Give either length.fixed or length.max, not both.');
  if (fixed === undefined && max === undefined) throw new RequestFieldError('/length', 'Give length.fixed (the weld length) or length.max (the longest weld available).');
  const available = fixed !== undefined ? { mode: 'fixed' as const, value: length(fixed, units, '/length/fixed') } : { mode: 'max' as const, value: length(max!, units, '/length/max') };
  const p = body.preferences ?? {};
  const opt = (v: number | string | undefined, pointer: string): number | undefined => (v === undefined ? undefined : length(v, units, pointer));
  return {
    method: body.method,
    units,
    electrode: body.electrode as ElectrodeSpec | 'match',
    demand: body.load.force,
    angle: body.load.angle ?? 0,
    lines: body.lines ?? 1,
    length: available,
    transverse: body.transverse ? { lines: body.transverse.lines ?? 1, length: length(body.transverse.length, units, '/transverse/length') } : null,
    endLoaded: body.endLoaded ?? false,
    parts: body.parts.map((part, i) => ({
      thickness: length(part.thickness, units, `/parts/${i}/thickness`),
      steel: part.steel as SteelSpec,
      edge: part.edge ?? false,
      faces: part.faces === 2 ? 2 : 1,
      loading: part.loading ?? 'shear',
    })),
    directionalIncrease: body.directionalIncrease ?? true,
    preferences: {
      maxSize: opt(p.maxSize, '/preferences/maxSize') ?? null,
      singlePass: p.singlePass ?? false,
      sizeStep: opt(p.sizeStep, '/preferences/sizeStep'),
      lengthStep: opt(p.lengthStep, '/preferences/lengthStep'),
      intermittent: p.intermittent ?? false,
      minSegment: opt(p.minSegment, '/preferences/minSegment') ?? null,
      alternatives: p.alternatives,
    },
  };
}

export const filletSize: Operation<FilletSizeBody> = {
  kind: 'fillet-size',
  path: '/v1/fillet/size',
  summary: 'Find the economical fillet weld for a demand',
  description:
    'Searches every fillet size (in the size step, from the AISC 360-22 Table J2.4 minimum to the edge rule of §J2.2b and the size preferences) and every length ' +
    '(the fixed length, or every length in the length step up to the maximum; intermittent layouts when allowed), checks each candidate exactly as POST /v1/fillet/check does, ' +
    'and answers the compliant weld with the least weld metal (then fewest passes, then lowest utilization) with its full check and ranked alternatives. ' +
    'When nothing complies the answer is status fail with values.blocking: what blocks it (size limits crossing, base metal too thin, length unavailable) and the changes that unblock it.',
  body: FilletSizeBody,
  response: FilletSizeResponse,
  examples: {
    gussetLengthOpen: {
      summary: 'WS-B14: longest 12 in, two lines of the cheapest E70 fillet for a 3/8 in gusset on a 3/4 in flange, LRFD',
      value: {
        id: 'WS-B14',
        method: 'LRFD',
        units: 'imperial',
        electrode: 'E70',
        load: { force: 90 },
        lines: 2,
        length: { max: 12 },
        parts: [
          { thickness: 0.375, steel: 'A572-50' },
          { thickness: 0.75, steel: 'A992' },
        ],
      },
    },
    strapFixedLength: {
      summary: 'WS-T07: metric strap splice, 150 mm lines fixed, matching electrode, intermittent allowed, ASD',
      value: {
        id: 'WS-T07',
        method: 'ASD',
        units: 'metric',
        electrode: 'match',
        load: { force: 120 },
        lines: 2,
        length: { fixed: 150 },
        parts: [
          { thickness: 10, steel: 'S355', edge: true },
          { thickness: 12, steel: 'S355' },
        ],
        preferences: { intermittent: true },
      },
    },
  },
  run(body) {
    return envelope(body, sizeFillet(toSizingRequest(body)));
  },
};
