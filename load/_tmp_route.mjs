import Fastify from 'fastify';
import { OPERATIONS } from '../dist/operations/index.js';
import { bodyValidator } from '../dist/plugins/validation.js';
import fjs from 'fast-json-stringify';
const op = OPERATIONS[0];
const validate = bodyValidator(op.body);
const body = JSON.parse(process.env.BODY);
const ans = op.run(body);
const schemas = OPERATIONS.map(o => o.response);
const app = Fastify({ logger: false });
for (const s of schemas) app.addSchema(s);
const ser = fjs({ $ref: op.response.$id }, { schema: Object.fromEntries(schemas.map(s => [s.$id, s])) });
const serSelf = fjs(op.response);
console.error('lens', ser(ans).length, JSON.stringify(ans).length);
const resp = { response: { 200: { $ref: op.response.$id } } };
app.post('/small', async () => ({ ok: true }));
app.post('/constobj', { schema: resp }, async () => ans);
app.post('/runsmall', async (req) => { if (!validate(req.body)) throw new Error('x'); const a = op.run(req.body); return { ok: a.status }; });
app.post('/run', { schema: resp }, async (req) => { if (!validate(req.body)) throw new Error('x'); return op.run(req.body); });
app.post('/runjson', async (req, reply) => { if (!validate(req.body)) throw new Error('x'); reply.type('application/json'); return JSON.stringify(op.run(req.body)); });
app.post('/runfjs', async (req, reply) => { if (!validate(req.body)) throw new Error('x'); reply.type('application/json'); return serSelf(op.run(req.body)); });

// micro
let t = performance.now(), n = 0; for (let i = 0; i < 100000; i++) n += ser(ans).length; console.error('ser us', (performance.now() - t) * 10 / 1000);
t = performance.now(); for (let i = 0; i < 100000; i++) n += JSON.stringify(ans).length; console.error('JSON us', (performance.now() - t) * 10 / 1000);
t = performance.now(); for (let i = 0; i < 100000; i++) n += op.run(body).utilization; console.error('run us', (performance.now() - t) * 10 / 1000);
app.post('/constbuf', async (req, reply) => { reply.type('application/json'); return Buffer.from(ser(ans)); });
app.post('/conststr', async (req, reply) => { reply.type('application/json'); return ser(ans); });
{
  let t = performance.now(), n = 0; for (let i = 0; i < 100000; i++) n += Buffer.from(ser(ans)).length; console.error('ser+buf us', (performance.now() - t) * 10 / 1000);
  t = performance.now(); for (let i = 0; i < 100000; i++) n += Buffer.byteLength(ser(ans)); console.error('ser+byteLength us', (performance.now() - t) * 10 / 1000);
  const flat = ser(ans);
  t = performance.now(); for (let i = 0; i < 100000; i++) n += Buffer.byteLength(flat); console.error('byteLength flat us', (performance.now() - t) * 10 / 1000);
  t = performance.now(); for (let i = 0; i < 100000; i++) n += Buffer.from(flat).length; console.error('Buffer.from flat us', (performance.now() - t) * 10 / 1000);
}

const bigc = ser(ans) + ' ';
let sink = 0;
app.post('/bigc', async (req, reply) => { reply.type('application/json'); return bigc; });
app.post('/serbutbig', async (req, reply) => { reply.type('application/json'); sink += ser(ans).length; return bigc; });
app.post('/jsonbutbig', async (req, reply) => { reply.type('application/json'); sink += JSON.stringify(ans).length; return bigc; });
app.post('/runbutbig', async (req, reply) => { reply.type('application/json'); sink += op.run(req.body).utilization; return bigc; });
await app.listen({ host: '127.0.0.1', port: 3962 });
