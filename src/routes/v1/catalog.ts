/** GET /v1/catalog/steels and /v1/catalog/electrodes: the built-in materials. */
import type { FastifyInstance } from 'fastify';
import { Type } from 'typebox';
import { electrodeCatalogue, steelCatalogue } from '../../engine/materials.js';
import { Units } from '../../schemas/common.js';

const Query = Type.Object({ units: Type.Optional(Units) }, { additionalProperties: false });

const SteelList = Type.Object(
  {
    units: Type.Object({ length: Type.String(), stress: Type.String() }, { additionalProperties: false }),
    steels: Type.Array(
      Type.Object(
        {
          name: Type.String(),
          standard: Type.String(),
          description: Type.String(),
          bands: Type.Array(
            Type.Object(
              { upTo: Type.Union([Type.Number(), Type.Null()], { description: 'Largest thickness the band covers (null: no limit).' }), fy: Type.Number(), fu: Type.Number() },
              { additionalProperties: false },
            ),
          ),
        },
        { additionalProperties: false },
      ),
    ),
  },
  { additionalProperties: false },
);

const ElectrodeList = Type.Object(
  {
    units: Type.Object({ stress: Type.String() }, { additionalProperties: false }),
    electrodes: Type.Array(Type.Object({ name: Type.String(), fexx: Type.Number(), native: Type.String() }, { additionalProperties: false })),
  },
  { additionalProperties: false },
);

export default async function catalogRoutes(app: FastifyInstance): Promise<void> {
  app.get('/v1/catalog/steels', {
    schema: { operationId: 'listSteels', tags: ['catalog'], summary: 'Built-in steel grades with Fy and Fu by thickness band', querystring: Query, response: { 200: SteelList } },
    handler: async (request) => {
      const units = (request.query as { units?: 'imperial' | 'metric' }).units ?? 'imperial';
      return { units: units === 'metric' ? { length: 'mm', stress: 'MPa' } : { length: 'in', stress: 'ksi' }, steels: steelCatalogue(units) };
    },
  });
  app.get('/v1/catalog/electrodes', {
    schema: { operationId: 'listElectrodes', tags: ['catalog'], summary: 'Built-in electrode classifications with FEXX', querystring: Query, response: { 200: ElectrodeList } },
    handler: async (request) => {
      const units = (request.query as { units?: 'imperial' | 'metric' }).units ?? 'imperial';
      return { units: { stress: units === 'metric' ? 'MPa' : 'ksi' }, electrodes: electrodeCatalogue(units) };
    },
  });
}
