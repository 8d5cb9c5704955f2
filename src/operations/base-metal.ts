/** POST /v1/base-metal/check: base-metal checks of one part along weld lines, on their own. */
import { Type, type Static } from 'typebox';
import { checkBaseMetal } from '../engine/base-metal.js';
import type { SteelSpec } from '../engine/materials.js';
import { Envelope, Id, Length, Load, Method, SheetFields, Steel, StringEnum, Units } from '../schemas/common.js';
import { envelope, length, type Operation } from './shared.js';

export const BaseMetalBody = Type.Object(
  {
    id: Type.Optional(Id),
    method: Method,
    units: Type.Optional(Units),
    sheet: Type.Optional(SheetFields),
    part: Type.Object(
      {
        thickness: Length('Thickness of the part.'),
        steel: Steel,
        faces: Type.Optional(Type.Integer({ minimum: 1, maximum: 2, description: '1: welds on one face; 2: welds on both faces along the same line, sharing one failure plane. Default 1.' })),
        loading: Type.Optional(StringEnum(['shear', 'tension'] as const, { description: 'shear: sheared along the weld lines (default); tension: pulled across them.' })),
      },
      { additionalProperties: false },
    ),
    lines: Type.Array(
      Type.Object(
        {
          length: Length('Length of one weld line on the part.'),
          count: Type.Optional(Type.Integer({ minimum: 1, maximum: 1000, description: 'Identical lines. Default 1.' })),
        },
        { additionalProperties: false },
      ),
      { minItems: 1, maxItems: 50 },
    ),
    load: Type.Optional(Load),
  },
  { additionalProperties: false, $id: 'BaseMetalCheckRequest', title: 'BaseMetalCheckRequest' },
);
export type BaseMetalBody = Static<typeof BaseMetalBody>;

const N = Type.Number();
export const BaseMetalValues = Type.Object(
  {
    weldLength: Type.Number({ description: 'Total weld length on the part.' }),
    planeLength: Type.Number({ description: 'Length of the failure plane (weld length / faces).' }),
    area: Type.Number({ description: 'Area of the failure plane, t × planeLength.' }),
    fy: N,
    fu: N,
  },
  { additionalProperties: false },
);

export const baseMetalCheck: Operation<BaseMetalBody> = {
  kind: 'base-metal',
  path: '/v1/base-metal/check',
  summary: 'Check the base metal of one part along weld lines',
  description: 'Shear yielding and rupture (AISC 360-22 §J4.2) of a part along its weld lines, or tension yielding and rupture (§J4.1) when the part is pulled across them.',
  body: BaseMetalBody,
  response: Envelope('BaseMetalCheckResult', BaseMetalValues),
  examples: {
    shearTab: {
      summary: 'WS-B07: 3/8 in A36 shear tab welded both faces along a 9 in line, LRFD',
      value: { id: 'WS-B07', method: 'LRFD', units: 'imperial', part: { thickness: 0.375, steel: 'A36', faces: 2 }, lines: [{ length: 9, count: 2 }], load: { force: 60 } },
    },
  },
  run(body) {
    const units = body.units ?? 'imperial';
    return envelope(
      body,
      checkBaseMetal({
        method: body.method,
        units,
        part: {
          thickness: length(body.part.thickness, units, '/part/thickness'),
          steel: body.part.steel as SteelSpec,
          faces: body.part.faces === 2 ? 2 : 1,
          loading: body.part.loading ?? 'shear',
        },
        lines: body.lines.map((l, i) => ({ length: length(l.length, units, `/lines/${i}/length`), count: l.count ?? 1 })),
        demand: body.load ? body.load.force : null,
      }),
    );
  },
};
