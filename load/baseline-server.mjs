// The ceiling the service is measured against: a bare Fastify server from the project's own
// dependencies, logger off, whose POST route parses the JSON body and returns a constant.
import { readFileSync } from 'node:fs';
import Fastify from 'fastify';

const app = Fastify({ logger: false, bodyLimit: 1 << 30 });
app.addContentTypeParser('application/x-ndjson', (_req, payload, done) => done(null, payload));
app.post('/bench', async () => ({ ok: true }));
app.get('/bench', async () => 'ok');
// A second reference: the service's own fillet answer (captured by the bench, same bytes) sent
// as a constant string, to tell the cost of the answer's size from the cost of making it.
const answer = process.env.BENCH_ANSWER_FILE ? readFileSync(process.env.BENCH_ANSWER_FILE, 'utf8') : '{}';
app.post('/bench-answer', async (_request, reply) => reply.type('application/json; charset=utf-8').send(answer));
await app.listen({ host: '127.0.0.1', port: Number(process.env.PORT ?? 3900) });
process.on('SIGTERM', () => app.close().then(() => process.exit(0)));
