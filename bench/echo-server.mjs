// Baseline for benchmark 1: a bare socket.io server with no database, no checks and no alarm rules.
// On 'readings:submit' it sends the same two events the service sends (readings:new and alarm:changed,
// with payloads of the same shape and size) to the room, then answers the acknowledgement.
import { createServer } from 'node:http';
import { Server } from 'socket.io';

const port = Number(process.argv[2] ?? process.env.BENCH_ECHO_PORT ?? 3291);
const http = createServer();
const io = new Server(http, { cors: { origin: false } });
let alarmCounter = 0;

io.on('connection', (socket) => {
  socket.on('room:join', (body, ack) => {
    void socket.join(body.room);
    ack?.({ ok: true, room: body.room });
  });
  socket.on('readings:submit', (body, ack) => {
    const room = `run:${body.runId}`;
    const now = new Date().toISOString();
    const readings = body.readings.map((r) => ({
      id: String(++alarmCounter),
      clientId: r.clientId,
      runId: body.runId,
      pointId: r.pointId,
      value: r.value,
      originalValue: null,
      unit: 'degF',
      takenAt: r.takenAt,
      source: 'live',
      enteredByName: null,
      amendments: [],
    }));
    for (const r of body.readings) {
      const raised = r.value > 130;
      io.to(room).emit('readings:new', { runId: body.runId, readings });
      io.to(room).emit('alarm:changed', {
        id: '00000000-0000-4000-8000-000000000000',
        engineId: '00000000-0000-4000-8000-000000000001',
        runId: body.runId,
        pointId: r.pointId,
        pointLabel: 'Latency bearing',
        kind: 'high',
        priority: 'high',
        state: raised ? 'active_unacknowledged' : 'returned_unacknowledged',
        conditionActive: raised,
        message: `Latency bearing is ${r.value} °F, above its high limit 130 °F.`,
        value: raised ? r.value : 131,
        limit: 130,
        unit: '°F',
        raisedAt: now,
        acknowledgedAt: null,
        acknowledgedByName: null,
        returnedAt: raised ? null : now,
        shelvedUntil: null,
        shelveReason: null,
        shelvedByName: null,
        updatedAt: now,
      });
    }
    ack?.({ ok: true, data: { stored: body.readings.length, duplicates: 0, rejected: [], rejectedCount: 0, alarmsRaised: 1 } });
  });
});

http.listen(port, '127.0.0.1', () => process.send?.('ready'));
process.on('SIGTERM', () => {
  void io.close();
  http.close(() => process.exit(0));
});
