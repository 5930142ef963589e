/**
 * The API row's peer: a bare Express app answering the draft-save route with a stored copy of a
 * real answer (the same bytes the Headroom server sent for the same request), so the two differ
 * only by what Headroom does between reading the body and writing the answer (helmet, cookies,
 * session, CSRF, project role, validation, the analysis, the database write).
 *
 * It reads the JSON body like the real server (express.json, the same 2 MB limit) and serialises
 * the answer on every request (res.json), so parsing and serialising the same sizes count on
 * both sides. Started by scripts/bench/api.ts as `node --import tsx scripts/bench/peer-server.ts`,
 * the same way the real server is started. Settings: PORT, HOST, BENCH_PEER_BODY (a JSON file).
 */
import fs from 'node:fs';
import express from 'express';

const bodyFile = process.env.BENCH_PEER_BODY;
if (!bodyFile) throw new Error('BENCH_PEER_BODY (the answer to send, a JSON file) is not set');
const answer: unknown = JSON.parse(fs.readFileSync(bodyFile, 'utf8'));

const app = express();
app.disable('x-powered-by');
app.get('/api/health', (_req, res) => {
  res.json({ ok: true });
});
app.put('/api/projects/:projectId/systems/:systemId/revisions/:revisionId/document', express.json({ limit: '2mb' }), (req, res) => {
  if (typeof req.body !== 'object' || req.body === null) {
    res.status(400).json({ error: 'expected a JSON object' });
    return;
  }
  res.json(answer);
});

const port = Number(process.env.PORT ?? 0);
const server = app.listen(port, process.env.HOST ?? '127.0.0.1', () => {
  const address = server.address();
  console.log(`[bench peer] listening on ${typeof address === 'object' && address ? address.port : port}`);
});
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => server.close(() => process.exit(0)));
