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
// A third reference: the bare route plus a fixed amount of arithmetic per request (a stand-in for
// any route's own work), one route per level in BENCH_WORK_US (µs, e.g. "5,20"). The loop is
// calibrated here, at start-up, on this process's own CPU time (the service may be busy on the
// same core at that moment, which would skew a wall-clock calibration).
let sink = 0;
const arithmetic = (n) => {
  let x = 0;
  for (let i = 0; i < n; i++) x += Math.sqrt(i);
  sink += x;
};
const levels = (process.env.BENCH_WORK_US ?? '').split(',').filter(Boolean).map(Number);
if (levels.length > 0) {
  for (let i = 0; i < 400; i++) arithmetic(10_000);
  const c0 = process.cpuUsage();
  for (let i = 0; i < 2000; i++) arithmetic(10_000);
  const c = process.cpuUsage(c0);
  const nsPerStep = ((c.user + c.system) * 1000) / 20_000_000;
  for (const us of levels) {
    const steps = Math.round((us * 1000) / nsPerStep);
    app.post(`/bench-work-${us}`, async () => {
      arithmetic(steps);
      return { ok: sink !== 0.5 };
    });
  }
}
await app.listen({ host: '127.0.0.1', port: Number(process.env.PORT ?? 3900) });
process.on('SIGTERM', () => app.close().then(() => process.exit(0)));
