/** POST /v1/weld-group/eccentric: eccentrically loaded fillet weld groups, and their figure. */
import { Type, type Static } from 'typebox';
import type { ElectrodeSpec, SteelSpec } from '../engine/materials.js';
import { analyseWeldGroup, type WeldGroupFigure, type WeldGroupRequest, type WeldGroupValues } from '../engine/weld-group/check.js';
import { MAX_ELEMENTS } from '../engine/weld-group/discretise.js';
import { SHAPE_NAMES, type Segment, type ShapeName } from '../engine/weld-group/geometry.js';
import { renderWeldGroupSvg } from '../report/weld-group-svg.js';
import { Electrode, Envelope, Id, Length, MAX_MAGNITUDE, Method, SheetFields, Steel, StringEnum, Units } from '../schemas/common.js';
import { RequestFieldError, envelope, length, type Envelope as EnvelopeOf, type Operation } from './shared.js';

const PATH = '/v1/weld-group/eccentric';
const MAX_FORCE = 1e9;
/** Wall-clock bound on the ICR solves of one request (the engine also has iteration and work bounds of its own). */
const SOLVE_TIME_LIMIT_MS = 3000;

const Coordinate = Type.Number({ minimum: -MAX_MAGNITUDE, maximum: MAX_MAGNITUDE });
const Point = (description: string) => Type.Array(Coordinate, { minItems: 2, maxItems: 2, description });

export const WeldSegment = Type.Object(
  {
    from: Point('Start point [x, y] in the plane of the faying surface.'),
    to: Point('End point [x, y].'),
  },
  { additionalProperties: false, description: 'A straight fillet weld of the group\'s size.' },
);

export const WeldGroupLoad = Type.Object(
  {
    fx: Type.Optional(Type.Number({ minimum: -MAX_FORCE, maximum: MAX_FORCE, description: 'Force component along x, in the weld plane (kip or kN).' })),
    fy: Type.Optional(Type.Number({ minimum: -MAX_FORCE, maximum: MAX_FORCE, description: 'Force component along y, in the weld plane.' })),
    fz: Type.Optional(Type.Number({ minimum: -MAX_FORCE, maximum: MAX_FORCE, description: 'Force component normal to the weld plane (positive away from the faying surface).' })),
    magnitude: Type.Optional(Type.Number({ minimum: 0, maximum: MAX_FORCE, description: 'Instead of fx/fy: the magnitude of an in-plane force (0 reports capacities only)...' })),
    angle: Type.Optional(Type.Number({ minimum: -360, maximum: 360, description: '...and its direction, degrees counter-clockwise from +x (-90: straight down).' })),
    at: Type.Optional(Point('A point on the line of the load (its point of application), same coordinates as the segments.')),
    eccentricity: Type.Optional(Type.Number({ minimum: -MAX_MAGNITUDE, maximum: MAX_MAGNITUDE, description: 'Instead of at: signed distance of the in-plane load\'s line from the centroid; the load\'s moment about the centroid is magnitude × eccentricity, counter-clockwise positive.' })),
    standoff: Type.Optional(Type.Number({ minimum: -MAX_MAGNITUDE, maximum: MAX_MAGNITUDE, description: 'Distance of the point of application from the weld plane (out-of-plane eccentricity). Default 0.' })),
  },
  {
    additionalProperties: false,
    description: 'The required strength (factored for LRFD, service for ASD) with its line: components fx, fy (and fz) or magnitude and angle; a point at or an eccentricity.',
  },
);

export const WeldGroupPartSchema = Type.Object(
  {
    thickness: Length('Thickness of the part.'),
    steel: Steel,
    segments: Type.Optional(Type.Array(Type.Integer({ minimum: 0, maximum: 49 }), { minItems: 1, maxItems: 50, description: 'Indexes of the segments that run along this part. Default: all.' })),
    edge: Type.Optional(Type.Boolean({ description: 'The welds run along an edge of this part (maximum-size rule). Default false.' })),
  },
  { additionalProperties: false },
);

export const WeldGroupBody = Type.Object(
  {
    id: Type.Optional(Id),
    method: Method,
    units: Type.Optional(Units),
    sheet: Type.Optional(SheetFields),
    electrode: Electrode,
    size: Type.Optional(Length('Fillet leg size w, one for the whole group. Omit it to get the smallest standard size that carries the load.')),
    segments: Type.Optional(Type.Array(WeldSegment, { minItems: 1, maxItems: 50, description: 'The welds as straight segments. Give segments or shape.' })),
    shape: Type.Optional(
      StringEnum(SHAPE_NAMES, {
        description:
          'Instead of segments, a common shape. Unrotated, from the origin: line (x = 0, y from 0 to height); parallel (lines at x = 0 and x = width); ' +
          'C (back at x = 0, flanges along y = 0 and y = height to x = width, open towards +x); L (back at x = 0, flange along y = 0); box (width × height).',
      }),
    ),
    height: Type.Optional(Length('With shape: length of the main (unrotated vertical) lines, the l of C = Pn/(D·l).')),
    width: Type.Optional(Length('With shape: spacing of parallel lines, or length of the flanges / horizontal lines. Not for a line.')),
    rotation: Type.Optional(Type.Number({ minimum: -360, maximum: 360, description: 'With shape: rotation about the origin, degrees counter-clockwise. Default 0.' })),
    origin: Type.Optional(Point('With shape: where its origin (lower-left corner, unrotated) is placed. Default [0, 0].')),
    load: WeldGroupLoad,
    parts: Type.Optional(Type.Array(WeldGroupPartSchema, { maxItems: 4, description: 'Connected parts: base-metal shear along their segments, and the size limits.' })),
    analysis: Type.Optional(StringEnum(['icr', 'elastic'] as const, { description: 'Method that governs for an eccentric in-plane load: icr (instantaneous centre, default) or elastic. Both are always reported.' })),
    elements: Type.Optional(Type.Integer({ minimum: 8, maximum: MAX_ELEMENTS, description: 'Total number of ICR elements, spread over the segments by length (at least 4 each). Default 100 per segment.' })),
    referenceLength: Type.Optional(Length('Length l of the coefficient C = Pn/(D·l). Default: height for a shape, else the longest segment.')),
    estimateError: Type.Optional(Type.Boolean({ description: 'Solve again with half the elements and report the change. Default true.' })),
  },
  { additionalProperties: false, $id: 'WeldGroupEccentricRequest', title: 'WeldGroupEccentricRequest' },
);
export type WeldGroupBody = Static<typeof WeldGroupBody>;

const N = Type.Number();
const NullableNumber = (description?: string) => Type.Union([Type.Number(), Type.Null()], description ? { description } : {});
const Pair = Type.Array(N, { minItems: 2, maxItems: 2 });
const NullablePair = (description: string) => Type.Union([Pair, Type.Null()], { description });

export const WeldGroupValuesSchema = Type.Object(
  {
    method: StringEnum(['icr', 'concentric-rule', 'elastic', 'elastic-out-of-plane'] as const, { description: 'Which method gave the weld check: icr; concentric-rule (load through the centroid, AISC 360-22 §J2.4); elastic; elastic-out-of-plane (load with a component normal to the weld plane).' }),
    concentricRule: Type.Union([StringEnum(['linear', 'mixed-J2-6a', 'mixed-J2-6b', 'no-increase'] as const), Type.Null()], { description: 'With a concentric load: the rule used.' }),
    fexx: N,
    size: Type.Number({ description: 'Fillet size checked (given, or chosen by sizing).' }),
    throat: N,
    totalLength: N,
    demand: Type.Number({ description: 'The load\'s magnitude.' }),
    direction: Type.Array(N, { minItems: 3, maxItems: 3, description: 'Unit direction of the load [x, y, z].' }),
    centroid: Pair,
    loadPoint: Type.Array(N, { minItems: 2, maxItems: 2, description: 'A point on the load\'s line in the weld plane.' }),
    eccentricity: Type.Number({ description: 'Signed distance of the in-plane load line from the centroid.' }),
    standoff: N,
    capacityNominal: Type.Number({ description: 'Nominal weld capacity Pn for the load\'s direction and line, by method.' }),
    capacityAvailable: Type.Number({ description: 'phi·Pn (LRFD) or Pn/Omega (ASD).' }),
    icrCapacityNominal: NullableNumber('Pn by the instantaneous centre method, when used.'),
    centre: NullablePair('The instantaneous centre [x, y]; null for a pure translation or when the ICR method was not used.'),
    centreDistance: NullableNumber('Distance of the instantaneous centre from the centroid.'),
    critical: Type.Union(
      [
        Type.Object(
          {
            segment: Type.Integer(),
            element: Type.Integer({ description: 'Index of the critical element among all elements.' }),
            point: Pair,
            radius: NullableNumber('Distance from the centre; null for a pure translation.'),
            deformation: Type.Number({ description: 'Deformation at ultimate du of the critical point.' }),
            angle: Type.Number({ description: 'Angle theta of its force to the weld axis, degrees.' }),
          },
          { additionalProperties: false },
        ),
        Type.Null(),
      ],
      { description: 'The critical point of the ICR solution (the weld end or element end point with the smallest du/r).' },
    ),
    residuals: Type.Union(
      [Type.Object({ fx: N, fy: N, moment: N, relative: Type.Number({ description: 'Size of the residuals relative to the load.' }) }, { additionalProperties: false }), Type.Null()],
      { description: 'Equilibrium left over at the ICR solution (forces, and moment about the centroid).' },
    ),
    iterations: NullableNumber('Newton iterations used.'),
    elements: Type.Integer({ description: 'Elements used by the ICR method (0 when it was not used).' }),
    discretisation: Type.Union(
      [Type.Object({ elementsCoarse: Type.Integer(), capacityCoarse: N, relativeChange: Type.Number({ description: 'Change of Pn with half the elements: an estimate of the discretisation error.' }) }, { additionalProperties: false }), Type.Null()],
    ),
    coefficient: Type.Union(
      [
        Type.Object(
          {
            C: Type.Number({ description: 'C = Pn/(D·l) in kip per sixteenth per inch, for the electrode used.' }),
            C1: Type.Number({ description: 'FEXX/70 (ksi).' }),
            CForE70: Type.Number({ description: 'C/C1.' }),
            referenceLength: N,
            sixteenths: Type.Number({ description: 'D, the size in sixteenths of an inch.' }),
            basis: Type.String(),
            scaling: Type.String(),
          },
          { additionalProperties: false },
        ),
        Type.Null(),
      ],
      { description: 'The Manual\'s coefficient for the capacity reported (AISC Manual Part 8).' },
    ),
    concentricCapacityNominal: NullableNumber('With a concentric load: Pn by the Specification\'s concentric rule.'),
    elastic: Type.Object(
      {
        capacityNominal: Type.Number({ description: 'Elastic method, without the directional increase.' }),
        capacityNominalDirectional: NullableNumber('Elastic method with the directional increase at the resultant\'s angle (in-plane loads only).'),
        capacityAvailable: N,
        critical: Type.Object({ segment: Type.Integer(), point: Pair }, { additionalProperties: false }),
        outOfPlane: Type.Boolean(),
      },
      { additionalProperties: false },
    ),
    sizing: Type.Union(
      [
        Type.Object(
          {
            minimumSize: Type.Number({ description: 'Size at which the weld capacity equals the load (proportional scaling).' }),
            standardSize: Type.Number({ description: 'Smallest standard size that carries the load (and meets the minimum size for the parts).' }),
            sizeStep: N,
            method: Type.String(),
          },
          { additionalProperties: false },
        ),
        Type.Null(),
      ],
      { description: 'The inverse problem: the weld size for the load.' },
    ),
    segments: Type.Array(
      Type.Object(
        { from: Pair, to: Pair, length: N, effectiveSize: N, throat: N, forcePerLength: Type.Number({ description: 'Largest force per unit length on the segment at the given load, by method.' }) },
        { additionalProperties: false },
      ),
    ),
    parts: Type.Array(
      Type.Object(
        {
          thickness: N,
          fy: N,
          fu: N,
          segments: Type.Array(Type.Integer()),
          governingSegment: Type.Union([Type.Integer(), Type.Null()]),
          shearYieldNominal: NullableNumber(),
          shearRuptureNominal: NullableNumber(),
        },
        { additionalProperties: false },
      ),
    ),
    figure: Type.Union([Type.String(), Type.Null()], { description: 'Link to this answer\'s figure (the GET form with format=svg), when the request fits in a link.' }),
  },
  { additionalProperties: false },
);

export type WeldGroupAnswerValues = WeldGroupValues & { figure: string | null };

/** Figures of the answers made by run(), keyed by the request object the route passes to render. */
const figures = new WeakMap<object, () => WeldGroupFigure>();

const nonZero = (v: number | undefined): boolean => v !== undefined && v !== 0;

export function toWeldGroupRequest(body: WeldGroupBody): WeldGroupRequest {
  const units = body.units ?? 'imperial';
  // ---- geometry ----
  let segments: Segment[] | null = null;
  let shape: WeldGroupRequest['shape'] = null;
  if (body.segments !== undefined && body.shape !== undefined) throw new RequestFieldError('/shape', 'Give segments or shape, not both.');
  if (body.segments !== undefined) {
    for (const f of ['height', 'width', 'rotation', 'origin'] as const) if (body[f] !== undefined) throw new RequestFieldError(`/${f}`, `${f} goes with shape, not with segments.`);
    segments = body.segments.map((s) => ({ from: [s.from[0]!, s.from[1]!], to: [s.to[0]!, s.to[1]!] }));
  } else if (body.shape !== undefined) {
    if (body.height === undefined) throw new RequestFieldError('/height', `A ${body.shape} shape needs its height (length of the main lines).`);
    const needsWidth = body.shape !== 'line';
    if (needsWidth && body.width === undefined) throw new RequestFieldError('/width', `A ${body.shape} shape needs its width.`);
    if (!needsWidth && body.width !== undefined) throw new RequestFieldError('/width', 'A line has no width.');
    shape = {
      shape: body.shape as ShapeName,
      height: length(body.height, units, '/height'),
      width: body.width === undefined ? 0 : length(body.width, units, '/width'),
      rotation: body.rotation ?? 0,
      origin: body.origin ? [body.origin[0]!, body.origin[1]!] : [0, 0],
    };
  } else {
    throw new RequestFieldError('/segments', 'Give the welds as segments, or as a shape with its dimensions.');
  }

  // ---- load ----
  const L = body.load;
  const byComponents = L.fx !== undefined || L.fy !== undefined || L.fz !== undefined;
  const byMagnitude = L.magnitude !== undefined || L.angle !== undefined;
  let direction: [number, number, number];
  let magnitude: number;
  if (byComponents && byMagnitude) throw new RequestFieldError('/load/magnitude', 'Give the load as fx/fy/fz or as magnitude and angle, not both.');
  if (byMagnitude) {
    if (L.magnitude === undefined) throw new RequestFieldError('/load/magnitude', 'An angle needs its magnitude.');
    if (L.angle === undefined) throw new RequestFieldError('/load/angle', 'A magnitude needs its angle (degrees counter-clockwise from +x).');
    const a = (L.angle * Math.PI) / 180;
    const exact = L.angle % 90 === 0;
    const c = exact ? [1, 0, -1, 0][(((L.angle / 90) % 4) + 4) % 4]! : Math.cos(a);
    const s = exact ? [0, 1, 0, -1][(((L.angle / 90) % 4) + 4) % 4]! : Math.sin(a);
    direction = [c, s, 0];
    magnitude = L.magnitude;
  } else if (byComponents) {
    direction = [L.fx ?? 0, L.fy ?? 0, L.fz ?? 0];
    magnitude = Math.hypot(...direction);
  } else {
    throw new RequestFieldError('/load/fx', 'Give the load as fx/fy (and fz), or as magnitude and angle.');
  }
  if (L.at !== undefined && L.eccentricity !== undefined) throw new RequestFieldError('/load/eccentricity', 'Give at or eccentricity, not both.');
  if (L.at === undefined && L.eccentricity === undefined) throw new RequestFieldError('/load/at', 'Give the load\'s point of application (at) or its eccentricity from the centroid.');
  if (L.eccentricity !== undefined && direction[0] === 0 && direction[1] === 0 && nonZero(direction[2])) {
    throw new RequestFieldError('/load/at', 'A load normal to the weld plane needs its point of application (at); an eccentricity is measured from an in-plane line.');
  }

  // ---- the rest ----
  const size = body.size === undefined ? null : length(body.size, units, '/size');
  if (size === null && !(magnitude > 0)) throw new RequestFieldError('/size', 'Give the weld size, or a load to size the weld for.');
  return {
    method: body.method,
    units,
    electrode: body.electrode as ElectrodeSpec,
    size,
    segments,
    shape,
    load: {
      direction,
      magnitude,
      at: L.at ? [L.at[0]!, L.at[1]!] : null,
      eccentricity: L.eccentricity ?? null,
      standoff: L.standoff ?? 0,
    },
    parts: (body.parts ?? []).map((p, i) => ({
      thickness: length(p.thickness, units, `/parts/${i}/thickness`),
      steel: p.steel as SteelSpec,
      segments: p.segments ?? null,
      edge: p.edge ?? false,
    })),
    analysis: body.analysis ?? 'icr',
    elements: body.elements ?? null,
    referenceLength: body.referenceLength === undefined ? null : length(body.referenceLength, units, '/referenceLength'),
    estimateError: body.estimateError ?? true,
    clock: { now: () => performance.now(), limitMs: SOLVE_TIME_LIMIT_MS },
  };
}

/** The GET link that reproduces a request (dotted names, lists with commas), or null when too long for a link. */
export function queryLink(body: object, extra: Record<string, string>): string | null {
  const pairs: string[] = [];
  const walk = (v: unknown, name: string): void => {
    if (v === undefined) return;
    if (Array.isArray(v)) {
      if (v.every((x) => typeof x === 'number')) pairs.push(`${name}=${v.map(String).join(',')}`);
      else v.forEach((x, i) => walk(x, `${name}.${i}`));
    } else if (v !== null && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) walk(x, name ? `${name}.${k}` : k);
    } else pairs.push(`${name}=${encodeURIComponent(String(v))}`);
  };
  walk(body, '');
  for (const [k, v] of Object.entries(extra)) pairs.push(`${k}=${encodeURIComponent(v)}`);
  const link = `${PATH}?${pairs.join('&')}`;
  return link.length <= 4000 ? link : null;
}

function render(answer: EnvelopeOf<WeldGroupAnswerValues>, body: WeldGroupBody): string {
  const figure = figures.get(body) ?? analyseWeldGroup(toWeldGroupRequest(body)).figure;
  return renderWeldGroupSvg(answer, figure());
}

export const weldGroupEccentric: Operation<WeldGroupBody, WeldGroupAnswerValues> = {
  kind: 'weld-group',
  path: PATH,
  summary: 'Check an eccentrically loaded fillet weld group',
  description:
    'Strength of a group of straight fillet welds of one size under an eccentric load: in the plane by the instantaneous centre of rotation method (AISC Manual Part 8), ' +
    'through the centroid by the Specification\'s concentric rules (AISC 360-22 §J2.4, Eq. J2-5 and J2-6), out of the plane by the elastic method; the elastic result beside ' +
    'the others, base-metal shear along each segment (§J4.2), the detailing limits, and the smallest standard size for the load. format=svg answers a drawing of the group, ' +
    'the load, the centroid, the instantaneous centre and the element forces.',
  body: WeldGroupBody,
  response: Envelope('WeldGroupEccentricResult', WeldGroupValuesSchema),
  examples: {
    bracketPlate: {
      summary: 'WS-C03: crane-rail bracket plate on a column flange, C-shaped 1/4 in E70 fillet, 30 kip at 8 in, LRFD',
      value: {
        id: 'WS-C03',
        method: 'LRFD',
        units: 'imperial',
        electrode: 'E70',
        size: '1/4',
        segments: [
          { from: [4, 0], to: [0, 0] },
          { from: [0, 0], to: [0, 10] },
          { from: [0, 10], to: [4, 10] },
        ],
        load: { fx: 0, fy: -30, at: [12, 5] },
        parts: [
          { thickness: 0.5, steel: 'A36' },
          { thickness: 0.56, steel: 'A992' },
        ],
      },
    },
    hoistBeamSeat: {
      summary: 'WS-H07: hoist-beam seat, two parallel 8 mm fillets by shape, 90 kN at 150 mm, metric ASD',
      value: {
        id: 'WS-H07',
        method: 'ASD',
        units: 'metric',
        electrode: 'E49',
        size: 8,
        shape: 'parallel',
        height: 250,
        width: 120,
        load: { magnitude: 90, angle: -90, eccentricity: -150 },
      },
    },
  },
  run(body) {
    const { result, figure } = analyseWeldGroup(toWeldGroupRequest(body));
    figures.set(body, figure);
    const values: WeldGroupAnswerValues = { ...result.values, figure: queryLink(body, { format: 'svg' }) };
    return envelope(body, { ...result, values });
  },
  formats: {
    svg: { contentType: 'image/svg+xml; charset=utf-8', render },
  },
};
