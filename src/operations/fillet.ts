/** POST /v1/fillet/check: the contract and its mapping to the engine. */
import { Type, type Static } from 'typebox';
import { checkFillet, type FilletLine, type FilletRequest } from '../engine/fillet.js';
import type { SteelSpec, ElectrodeSpec } from '../engine/materials.js';
import { Electrode, Envelope, Id, Length, Load, Method, SheetFields, Steel, StringEnum, Units } from '../schemas/common.js';
import { RequestFieldError, envelope, length, type Operation } from './shared.js';

export const FilletWeld = Type.Object(
  {
    size: Type.Optional(Length('Leg size w of an equal-leg fillet. Give size or legs.')),
    legs: Type.Optional(Type.Array(Length('Leg'), { minItems: 2, maxItems: 2, description: 'Unequal legs [leg on parts[0], leg on parts[1]]. Give size or legs.' })),
    length: Length('Length of one line (of one segment when intermittent).'),
    angle: Type.Optional(Type.Number({ minimum: 0, maximum: 90, description: 'Angle between the load and the weld axis, degrees: 0 longitudinal, 90 transverse. Default 0.' })),
    count: Type.Optional(Type.Integer({ minimum: 1, maximum: 1000, description: 'Number of identical lines. Default 1.' })),
    endLoaded: Type.Optional(Type.Boolean({ description: 'Longitudinal weld at the end of an axially loaded member: the length reduction of Eq. J2-1 applies. Default false.' })),
    builtOut: Type.Optional(Type.Boolean({ description: 'The drawings call for the weld to be built out to full throat along an edge. Default false.' })),
    intermittent: Type.Optional(
      Type.Object(
        {
          segments: Type.Integer({ minimum: 1, maximum: 10000, description: 'Segments per line.' }),
          pitch: Length('Centre-to-centre spacing of segments.'),
        },
        { additionalProperties: false, description: 'Intermittent weld: length is then the length of one segment.' },
      ),
    ),
  },
  { additionalProperties: false },
);

export const FilletPart = Type.Object(
  {
    thickness: Length('Thickness of the part.'),
    steel: Steel,
    edge: Type.Optional(Type.Boolean({ description: 'The welds run along an edge of this part (maximum-size rule). Default false.' })),
    faces: Type.Optional(Type.Integer({ minimum: 1, maximum: 2, description: '1: welds on one face of the part; 2: welds on both faces along the same line, sharing one failure plane. Default 1.' })),
    loading: Type.Optional(StringEnum(['shear', 'tension'] as const, { description: 'shear: the part is sheared along the weld lines (default); tension: the part is pulled across them.' })),
  },
  { additionalProperties: false },
);

export const FilletCheckBody = Type.Object(
  {
    id: Type.Optional(Id),
    method: Method,
    units: Type.Optional(Units),
    sheet: Type.Optional(SheetFields),
    electrode: Electrode,
    welds: Type.Array(FilletWeld, { minItems: 1, maxItems: 50, description: 'Weld lines of one joint, loaded through the group\'s centroid.' }),
    parts: Type.Array(FilletPart, { minItems: 1, maxItems: 4, description: 'The connected parts; parts[0] and parts[1] carry legs[0] and legs[1].' }),
    load: Type.Optional(Load),
    directionalIncrease: Type.Optional(Type.Boolean({ description: 'Use the directional increase (Eq. J2-5, J2-6) where permitted. Default true.' })),
    lap: Type.Optional(Length('Lap of a lap joint (minimum-lap rule).')),
    flatBarWidth: Type.Optional(Length('Perpendicular distance between longitudinal welds used alone at the end of a flat bar in tension.')),
  },
  { additionalProperties: false, $id: 'FilletCheckRequest', title: 'FilletCheckRequest' },
);
export type FilletCheckBody = Static<typeof FilletCheckBody>;

const N = Type.Number();
export const FilletValues = Type.Object(
  {
    fexx: N,
    groupRule: StringEnum(['linear', 'mixed-J2-6a', 'mixed-J2-6b', 'no-increase'] as const, { description: 'Which rule gave the weld strength.' }),
    throat: Type.Number({ description: 'Effective throat of welds[0].' }),
    effectiveLength: Type.Number({ description: 'Total effective length of all lines.' }),
    area: Type.Number({ description: 'Total effective area Awe.' }),
    weldMetalNominal: N,
    welds: Type.Array(
      Type.Object(
        { size: N, legs: Type.Array(N), throat: N, effectiveSize: N, effectiveThroat: N, effectiveLength: N, beta: N, kds: N, area: N, nominal: N },
        { additionalProperties: false },
      ),
    ),
    parts: Type.Array(
      Type.Object(
        {
          thickness: N,
          fy: N,
          fu: N,
          planeLength: Type.Number({ description: 'Length of the failure plane along the weld.' }),
          area: N,
          tMatch: Type.Number({ description: 'Thickness at which this part\'s shear rupture equals the weld metal (Manual Part 9).' }),
        },
        { additionalProperties: false },
      ),
    ),
  },
  { additionalProperties: false },
);

export const FilletCheckResponse = Envelope('FilletCheckResult', FilletValues);


export function toFilletRequest(body: FilletCheckBody): FilletRequest {
  const units = body.units ?? 'imperial';
  const welds: FilletLine[] = body.welds.map((w, i) => {
    const at = `/welds/${i}`;
    let legs: [number, number];
    if (w.size !== undefined && w.legs !== undefined) throw new RequestFieldError(`${at}/legs`, 'Give either size or legs, not both.');
    if (w.size !== undefined) {
      const s = length(w.size, units, `${at}/size`);
      legs = [s, s];
    } else if (w.legs !== undefined) {
      legs = [length(w.legs[0]!, units, `${at}/legs/0`), length(w.legs[1]!, units, `${at}/legs/1`)];
    } else {
      throw new RequestFieldError(`${at}/size`, 'Give the weld size (or legs for an unequal-leg fillet).');
    }
    return {
      legs,
      length: length(w.length, units, `${at}/length`),
      angle: w.angle ?? 0,
      count: w.count ?? 1,
      endLoaded: w.endLoaded ?? false,
      builtOut: w.builtOut ?? false,
      intermittent: w.intermittent ? { segments: w.intermittent.segments, pitch: length(w.intermittent.pitch, units, `${at}/intermittent/pitch`) } : null,
    };
  });
  return {
    method: body.method,
    units,
    electrode: body.electrode as ElectrodeSpec,
    welds,
    parts: body.parts.map((p, i) => ({
      thickness: length(p.thickness, units, `/parts/${i}/thickness`),
      steel: p.steel as SteelSpec,
      edge: p.edge ?? false,
      faces: p.faces === 2 ? 2 : 1,
      loading: p.loading ?? 'shear',
    })),
    demand: body.load ? body.load.force : null,
    directionalIncrease: body.directionalIncrease ?? true,
    lap: body.lap === undefined ? null : length(body.lap, units, '/lap'),
    flatBarWidth: body.flatBarWidth === undefined ? null : length(body.flatBarWidth, units, '/flatBarWidth'),
  };
}

export const filletCheck: Operation<FilletCheckBody> = {
  kind: 'fillet',
  path: '/v1/fillet/check',
  summary: 'Check fillet welds and the base metal beside them',
  description:
    'Strength of one fillet line or a concentric group of lines (AISC 360-22 §J2.4: Eq. J2-4, the directional increase of Eq. J2-5 and the mixed-group rule of Eq. J2-6), ' +
    'shear or tension of each connected part along the weld (§J4), and the detailing limits of §J2.2b and Table J2.4.',
  body: FilletCheckBody,
  response: FilletCheckResponse,
  examples: {
    gussetToColumn: {
      summary: 'WS-B12: 5/16 in E70 fillets both sides of a 1/2 in gusset on a W-shape flange, LRFD',
      value: {
        id: 'WS-B12',
        method: 'LRFD',
        units: 'imperial',
        electrode: 'E70',
        welds: [{ size: '5/16', length: 10, angle: 0, count: 2 }],
        load: { force: 120 },
        parts: [
          { thickness: 0.5, steel: 'A572-50', faces: 2 },
          { thickness: 0.75, steel: 'A992' },
        ],
      },
    },
    lapSplice: {
      summary: 'WS-T04: metric lap splice of a 10 mm strap, three-sided 6 mm fillets, ASD',
      value: {
        id: 'WS-T04',
        method: 'ASD',
        units: 'metric',
        electrode: 'E49',
        welds: [
          { size: 6, length: 120, angle: 0, count: 2 },
          { size: 6, length: 100, angle: 90 },
        ],
        load: { force: 180 },
        lap: 120,
        parts: [
          { thickness: 10, steel: 'S355', edge: true },
          { thickness: 12, steel: 'S355' },
        ],
      },
    },
  },
  run(body) {
    return envelope(body, checkFillet(toFilletRequest(body)));
  },
};
