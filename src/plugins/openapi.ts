/**
 * The OpenAPI 3.1 document, generated from the route schemas, served as JSON and YAML, with a
 * browsable reference page at /docs.
 */
import swagger from '@fastify/swagger';
import swaggerUi from '@fastify/swagger-ui';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { Problem } from '../schemas/common.js';
import { NOTICE } from '../engine/notice.js';
import { ENGINE_VERSION } from '../version.js';

export const API_DESCRIPTION =
  'Throatline checks welded joints of structural steel to AISC 360-22 Chapter J (§J2 welds, §J4 affected elements): ' +
  'every answer says pass or fail, which limit state governs (a stable code), every check with its clause, the detailing limits and warnings.\n\n' +
  `**Caution.** ${NOTICE}\n\n` +
  '**Access.** A deployment may require an API key (`Authorization: Bearer <key>` or the `x-throatline-key` header; 401 without one) and may limit ' +
  'requests per key or client address (429 with `Retry-After`); a replica under overload, or already holding as many request bodies as it takes at once, answers 503 with `Retry-After`. Every refusal is an RFC 9457 problem document. ' +
  '/healthz, /readyz, this contract and /docs never need a key.';

/** Both ways of presenting an API key; optional, since a deployment decides whether keys are required. */
export const SECURITY_SCHEMES = {
  bearerKey: { type: 'http', scheme: 'bearer', description: 'API key as a bearer token: `Authorization: Bearer <key>`.' },
  headerKey: { type: 'apiKey', in: 'header', name: 'x-throatline-key', description: 'API key in a header of its own.' },
} as const;

export default fp(
  async function openapi(app: FastifyInstance, opts: { docs?: boolean }) {
    app.addSchema(Problem);
    await app.register(swagger, {
      openapi: {
        openapi: '3.1.0',
        info: { title: 'Throatline weld design service', version: ENGINE_VERSION.replace(/^throatline /, ''), description: API_DESCRIPTION, license: { name: 'Proprietary', identifier: 'LicenseRef-Throatline' } },
        servers: [{ url: 'http://localhost:3000', description: 'Local service with the embedded default configuration' }],
        components: { securitySchemes: SECURITY_SCHEMES },
        security: [{}, { bearerKey: [] }, { headerKey: [] }],
        tags: [
          { name: 'fillet', description: 'Fillet welds (AISC 360-22 §J2.2, §J2.4)' },
          { name: 'base-metal', description: 'Base metal along weld lines (AISC 360-22 §J4)' },
          { name: 'groove-pjp', description: 'Partial-joint-penetration groove welds, flare grooves included (AISC 360-22 §J2.1, Table J2.5)' },
          { name: 'groove-cjp', description: 'Complete-joint-penetration groove welds (AISC 360-22 §J2.1, Table J2.5)' },
          { name: 'plug-slot', description: 'Plug and slot welds (AISC 360-22 §J2.3)' },
          { name: 'weld-group', description: 'Eccentrically loaded weld groups (AISC Manual Part 8)' },
          { name: 'batch', description: 'Many checks in one request, JSON or NDJSON' },
          { name: 'catalog', description: 'Built-in steels and electrodes' },
          { name: 'service', description: 'Health and the contract itself' },
        ],
      },
      refResolver: { buildLocalReference: (json, _baseUri, _fragment, i) => (typeof json.$id === 'string' ? json.$id : `def-${i}`) },
    });
    app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
    app.get('/openapi.yaml', { schema: { hide: true } }, async (_req, reply) => reply.type('application/yaml; charset=utf-8').send(app.swagger({ yaml: true })));
    if (opts.docs !== false) {
      await app.register(swaggerUi, { routePrefix: '/docs', uiConfig: { docExpansion: 'list', deepLinking: true }, staticCSP: true });
    }
  },
  { name: 'openapi' },
);
