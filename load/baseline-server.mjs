// The ceiling the service is measured against: a bare Fastify server from the project's own
// dependencies, logger off, whose POST route parses the JSON body and returns a constant.
import Fastify from 'fastify';

const app = Fastify({ logger: false, bodyLimit: 1 << 30 });
app.addContentTypeParser('application/x-ndjson', (_req, payload, done) => done(null, payload));
app.post('/bench', async () => ({ ok: true }));
app.get('/bench', async () => 'ok');
await app.listen({ host: '127.0.0.1', port: Number(process.env.PORT ?? 3900) });
process.on('SIGTERM', () => app.close().then(() => process.exit(0)));
