// Baseline for benchmark 7: a bare socket.io server (no database work, no checks, no alarm rules) with the same
// PostgreSQL adapter as the service, so that two of them share rooms. On 'readings:submit' it sends one
// 'alarm:changed' of the service's shape to the room (reaching the viewers of both), then acknowledges.
import { createServer } from 'node:http';
import { createAdapter } from '@socket.io/postgres-adapter';
import pg from 'pg';
import { Server } from 'socket.io';

const port = Number(process.argv[2]);
const pool = new pg.Pool({ connectionString: process.argv[3], max: 4 });
const http = createServer();
const io = new Server(http, { cors: { origin: false }, transports: ['websocket'] });
io.adapter(createAdapter(pool));

io.on('connection', (socket) => {
  socket.on('room:join', (body, ack) => {
    void socket.join(body.room);
    ack?.({ ok: true, room: body.room });
  });
  socket.on('readings:submit', (body, ack) => {
    const now = new Date().toISOString();
    for (const r of body.readings) {
      const raised = r.value > 50;
      io.to(`run:${body.runId}`).emit('alarm:changed', {
        id: '00000000-0000-4000-8000-000000000000',
        engineId: '00000000-0000-4000-8000-000000000001',
        runId: body.runId,
        pointId: r.pointId,
        pointLabel: 'Main oil pressure',
        kind: 'high',
        priority: 'high',
        state: raised ? 'active_unacknowledged' : 'returned_unacknowledged',
        conditionActive: raised,
        message: `Main oil pressure is ${r.value} psig, above its high limit 50 psig.`,
        value: raised ? r.value : 51,
        limit: 50,
        unit: 'psig',
        raisedAt: now,
        acknowledgedAt: null,
        acknowledgedByName: null,
        returnedAt: raised ? null : now,
        shelvedUntil: null,
        shelveReason: null,
        shelvedByName: null,
        suppression: null,
        suppressedById: null,
        suppressedByLabel: null,
        updatedAt: now,
      });
    }
    ack?.({ ok: true, data: { stored: body.readings.length, duplicates: 0, rejected: [], rejectedCount: 0, alarmsRaised: 1 } });
  });
});

http.listen(port, '127.0.0.1', () => process.send?.('ready'));
process.on('SIGTERM', () => {
  void io.close();
  void pool.end();
  http.close(() => process.exit(0));
});
