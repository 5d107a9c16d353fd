import { randomUUID } from 'node:crypto';
import type { Socket } from 'socket.io-client';
import type { CardSetDto, CardTrace, EngineDetail, IndicatedPowerRequest, RunDetail, RunRecordEvent } from '@crankjournal/shared-types';
import { computeIndicatedPower } from '../src/calculations/indicated-power.js';
import { calibrateTrace } from '../src/calculations/indicator-card.js';
import { encodePng, drawIndicatorCard } from '../src/database/seeds/card-image.js';
import { psigToPsia } from '../src/calculations/units.js';
import { createEngine, createPreparingRun, engineBody } from './factories/engine.factory.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { connected, socketAs } from './utils/socket.js';
import { signedIn } from './utils/signed-in.js';

const WAIT_MS = 5_000;

/** The calculator body of the issue: HP cards by planimeter and by mid-ordinates, LP by MEP. */
const ISSUE_BODY: IndicatedPowerRequest = {
  rpm: 40,
  strokeIn: 66,
  cylinders: [
    {
      label: 'HP',
      boreIn: 22.57,
      pistonRodIn: 4,
      tailRodIn: 0,
      cards: [
        { end: 'head', areaSqIn: 2.6, lengthIn: 3.6, springPsiPerIn: 60 },
        { end: 'crank', ordinatesIn: [0.9, 0.85, 0.8, 0.74, 0.69, 0.63, 0.55, 0.46, 0.35, 0.2], springPsiPerIn: 60 },
      ],
    },
    { label: 'LP', boreIn: 44, pistonRodIn: 4, tailRodIn: 4, cards: [{ end: 'head', meanEffectivePressurePsi: 12.4 }] },
  ],
};
const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x)) as T;

/** An invented tandem compound for the tests: HP 24 in, LP 44 in (4 in tail rod), 5.5 in rods, 48 in stroke. */
function compoundBody() {
  const b = engineBody(`Card test engine ${randomUUID().slice(0, 8)}`);
  b.type = 'tandem_compound';
  b.cylinders = [
    { label: 'HP', role: 'high', boreIn: 24, strokeIn: 48, pistonRodIn: 5.5, tailRodIn: 0, clearancePercent: 8 },
    { label: 'LP', role: 'low', boreIn: 44, strokeIn: 48, pistonRodIn: 5.5, tailRodIn: 4, clearancePercent: 6 },
  ];
  b.measurementPoints.push(
    { code: 'RCV', label: 'Receiver', kind: 'receiver_pressure', unit: 'psig', sequence: 5 },
    { code: 'VAC', label: 'Vacuum', kind: 'vacuum', unit: 'inHg', sequence: 6 },
    { code: 'BAR', label: 'Barometer', kind: 'barometer', unit: 'inHg', sequence: 7 },
  );
  return b;
}

describe('indicator cards and indicated power', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let observer: SignedIn;
  let engine: EngineDetail;
  let run: RunDetail;
  const sockets: Socket[] = [];
  const cyl = (label: string) => engine.cylinders.find((c) => c.label === label)!.id;
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;

  beforeAll(async () => {
    t = await startTestApp();
    [chief, operator, observer] = [await login(t, 'chief_engineer'), await login(t, 'operator'), await login(t, 'observer')];
    engine = await createEngine(t, chief.accessToken, compoundBody());
    run = await createPreparingRun(t, operator.accessToken, engine.id);
  }, 180_000);
  afterEach(() => {
    for (const s of sockets.splice(0)) s.disconnect();
  });
  afterAll(async () => {
    await t?.close();
  });

  // -----------------------------------------------------------------------------------------------
  describe('POST /api/calculations/indicated-power', () => {
    const post = (body: unknown, who: SignedIn = observer) =>
      signedIn(t, who)
        .post('/api/calculations/indicated-power')
        .send(body as object);

    it('answers the issue’s body with the module’s own numbers, for any signed-in role (an observer here)', async () => {
      const res = await post(ISSUE_BODY);
      expect(res.status).toBe(200);
      expect(res.body).toEqual(computeIndicatedPower(clone(ISSUE_BODY)));
      // The HP head card is Machinery’s Reference Series No. 70 example: 2.6 in², 3.6 in, 60 lb → 43.3 psi.
      expect(res.body.cylinders[0].ends[0].meanEffectivePressurePsi).toBeCloseTo(43.3, 1);
      expect(res.body.totalIndicatedKilowatts).toBeGreaterThan(0);
    });

    it('says the set is incomplete: the LP crank end has no card, so no referred MEP and the total is the cards present', async () => {
      const res = await post(ISSUE_BODY);
      expect(res.status).toBe(200);
      expect(res.body.complete).toBe(false);
      expect(res.body.missingEnds).toEqual([{ cylinderLabel: 'LP', end: 'crank' }]);
      expect(res.body.referredMeanEffectivePressurePsi).toBeNull();
      expect(res.body.referredMeanEffectivePressureMissing).toMatch(/missing: LP crank end/);
    });

    it(
      '39.81 psi, 400 in² piston, 5½ ft stroke, 40 rpm → 212.32 IHP (C. P. Brooks, Cotton Manufacturing, section on ' +
        'engines, transcribed online)',
      async () => {
        const boreIn = Math.sqrt((4 * 400) / Math.PI);
        const res = await post({
          rpm: 40,
          strokeIn: 66,
          cylinders: [
            {
              label: 'Mill',
              boreIn,
              pistonRodIn: 0,
              tailRodIn: 0,
              cards: [
                { end: 'head', meanEffectivePressurePsi: 39.81 },
                { end: 'crank', meanEffectivePressurePsi: 39.81 },
              ],
            },
          ],
        });
        expect(res.status).toBe(200);
        expect(res.body.totalIndicatedHorsepower).toBeCloseTo(212.32, 2);
      },
    );

    const bad: [string, (b: IndicatedPowerRequest) => void, RegExp][] = [
      [
        'a card giving two ways',
        (b) => (b.cylinders[0].cards[0].meanEffectivePressurePsi = 40),
        /cylinders\[0\]\.cards\[0\]\.areaSqIn: a card gives only one way/,
      ],
      ['a card giving none', (b) => (b.cylinders[1].cards[0] = { end: 'head' }), /cylinders\[1\]\.cards\[0\]: give one of/],
      [
        'an area card without its spring',
        (b) => delete b.cylinders[0].cards[0].springPsiPerIn,
        /cylinders\[0\]\.cards\[0\]\.springPsiPerIn/,
      ],
      ['a zero bore', (b) => (b.cylinders[0].boreIn = 0), /cylinders\.0\.boreIn must be greater than zero/],
      ['a negative speed', (b) => (b.rpm = -40), /rpm must be greater than zero/],
      ['a zero card length', (b) => (b.cylinders[0].cards[0].lengthIn = 0), /cylinders\.0\.cards\.0\.lengthIn must be greater than zero/],
      ['a zero stroke', (b) => (b.strokeIn = 0), /strokeIn must be greater than zero/],
      [
        'a piston rod not smaller than its bore',
        (b) => (b.cylinders[0].pistonRodIn = 22.57),
        /cylinders\[0\]\.pistonRodIn: must be smaller than the bore/,
      ],
      [
        'a tail rod larger than its bore',
        (b) => (b.cylinders[1].tailRodIn = 50),
        /cylinders\[1\]\.tailRodIn: must be smaller than the bore/,
      ],
      [
        'two cards for the same end',
        (b) => (b.cylinders[0].cards[1].end = 'head'),
        /cylinders\[0\]\.cards\[1\]\.end: a second card for the head end/,
      ],
      ['an end that is neither', (b) => ((b.cylinders[0].cards[1] as { end: string }).end = 'middle'), /end must be one of: head, crank/],
      ['no cylinders', (b) => (b.cylinders = []), /cylinders needs at least one cylinder/],
      [
        'an ordinate that is not a number',
        (b) => ((b.cylinders[0].cards[1].ordinatesIn as unknown[])[3] = 'x'),
        /ordinatesIn must hold only numbers/,
      ],
      ['an unknown field', (b) => ((b as unknown as Record<string, unknown>).horsepowerPlease = true), /horsepowerPlease should not exist/],
    ];
    it.each(bad)('refuses %s with 400 naming the field', async (_, mutate, message) => {
      const body = clone(ISSUE_BODY);
      mutate(body);
      const res = await post(body);
      expect(res.status).toBe(400);
      const text = ([] as string[]).concat(res.body.message).join(' | ');
      expect(text).toMatch(message);
    });

    it('needs a signed-in person', async () => {
      expect((await t.http.post('/api/calculations/indicated-power').send(ISSUE_BODY)).status).toBe(401);
    });

    it('is documented in the OpenAPI page with its body and answer', async () => {
      const doc = (await t.http.get('/api/docs-json')).body;
      const op = doc.paths['/api/calculations/indicated-power'].post;
      expect(op.requestBody.content['application/json'].schema.$ref).toMatch(/IndicatedPowerRequestDto/);
      expect(op.responses['200'].content['application/json'].schema.$ref).toBe('#/components/schemas/IndicatedPowerResponse');
      expect(Object.keys(doc.components.schemas.IndicatedPowerCardDto.properties)).toEqual(
        expect.arrayContaining(['end', 'meanEffectivePressurePsi', 'areaSqIn', 'lengthIn', 'springPsiPerIn', 'ordinatesIn']),
      );
    });
  });

  // -----------------------------------------------------------------------------------------------
  describe('card images', () => {
    const upload = (body: Buffer, contentType: string, who: SignedIn = operator, runId = run.id) =>
      signedIn(t, who).post(`/api/runs/${runId}/card-images`).set('content-type', contentType).send(body);

    it('stores a PNG and gives it back with its size read from the bytes', async () => {
      const png = encodePng(40, 30, new Uint8Array(40 * 30 * 3).fill(200));
      const res = await upload(png, 'application/octet-stream');
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ contentType: 'image/png', widthPx: 40, heightPx: 30, bytes: png.length, runId: run.id });
      const back = await signedIn(t, observer)
        .get(`/api/card-images/${res.body.id}`)
        .buffer(true)
        .parse((r, cb) => {
          const parts: Buffer[] = [];
          r.on('data', (c: Buffer) => parts.push(c));
          r.on('end', () => cb(null, Buffer.concat(parts)));
        });
      expect(back.status).toBe(200);
      expect(back.headers['content-type']).toBe('image/png');
      expect(Buffer.compare(back.body as Buffer, png)).toBe(0);
    });

    it('refuses a file that is not an image by its content, whatever it is called or claims to be (415)', async () => {
      expect((await upload(Buffer.from('this is a text file called card.png'), 'image/png')).status).toBe(415);
      expect((await upload(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><circle r="4"/></svg>'), 'image/svg+xml')).status).toBe(
        415,
      );
      expect((await upload(Buffer.from('%PDF-1.7\n%âãÏÓ\n'), 'image/jpeg')).status).toBe(415);
    });

    it('refuses an image larger than UPLOAD_MAX_BYTES (413), and an empty body (400)', async () => {
      const big = Buffer.concat([encodePng(4, 4, new Uint8Array(48)), Buffer.alloc(10 * 1024 * 1024 + 1)]);
      const res = await upload(big, 'image/png');
      expect(res.status).toBe(413);
      expect(res.body.message).toMatch(/larger than/);
      expect((await upload(Buffer.alloc(0), 'image/png')).status).toBe(400);
    });

    it('an observer cannot upload (403)', async () => {
      expect((await upload(encodePng(2, 2, new Uint8Array(12)), 'image/png', observer)).status).toBe(403);
    });
  });

  // -----------------------------------------------------------------------------------------------
  describe('card sets of a run', () => {
    const takenAt = () => new Date(Date.now() - 60_000).toISOString();

    async function observerSocket(runId: string): Promise<Socket> {
      const s = socketAs(t.url, observer);
      sockets.push(s);
      await connected(s);
      const ack = await s.timeout(WAIT_MS).emitWithAck('room:join', { room: `run:${runId}` });
      expect(ack).toMatchObject({ ok: true });
      return s;
    }
    const nextRecord = (s: Socket, kind: string) =>
      new Promise<RunRecordEvent>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error('no run:record within 5 s')), WAIT_MS);
        const on = (e: RunRecordEvent) => {
          if (e.kind !== kind) return;
          clearTimeout(timer);
          s.off('run:record', on);
          resolve(e);
        };
        s.on('run:record', on);
      });

    /** A drawn HP head-end card, uploaded, with the trace made on it. */
    async function tracedCard() {
      const drawn = drawIndicatorCard({
        seed: 'e2e-hp-head',
        end: 'head',
        admissionPressurePsia: psigToPsia(126),
        backPressurePsia: psigToPsia(28.5),
        cutOffFraction: 0.35,
        clearanceFraction: 0.08,
        springPsiPerIn: 80,
        lengthIn: 3.5,
      });
      const up = await signedIn(t, operator).post(`/api/runs/${run.id}/card-images`).set('content-type', 'image/png').send(drawn.png);
      expect(up.status).toBe(201);
      return { imageId: up.body.id as string, trace: drawn.trace };
    }

    it('takes a set (speed and pressures from the nearest readings), stores the results and broadcasts them to the run room', async () => {
      const at = new Date(Date.now() - 2 * 60_000);
      const round = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({
          takenAt: at.toISOString(),
          readings: [
            { clientId: randomUUID(), pointId: point('SPD'), value: 74.2, takenAt: at.toISOString() },
            { clientId: randomUUID(), pointId: point('THR'), value: 131, takenAt: at.toISOString() },
            { clientId: randomUUID(), pointId: point('RCV'), value: 27, takenAt: at.toISOString() },
            { clientId: randomUUID(), pointId: point('VAC'), value: 24.5, takenAt: at.toISOString() },
          ],
        });
      expect(round.status).toBe(201);

      const s = await observerSocket(run.id);
      const arrived = nextRecord(s, 'card_set');
      const { imageId, trace } = await tracedCard();
      const ordinatesIn = [0.62, 0.6, 0.57, 0.55, 0.52, 0.49, 0.45, 0.41, 0.36, 0.3];
      const res = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/card-sets`)
        .send({
          takenAt: takenAt(),
          cutOffPercent: 35,
          cards: [
            { cylinderId: cyl('HP'), end: 'head', springPsiPerIn: 80, lengthIn: 3.5, imageId, trace, compressionPercent: 12 },
            { cylinderId: cyl('HP'), end: 'crank', springPsiPerIn: 80, lengthIn: 3.5, areaSqIn: 2.4 },
            { cylinderId: cyl('LP'), end: 'head', springPsiPerIn: 20, ordinatesIn, cutOffPercent: 42, admissionPressurePsig: 24.5 },
            { cylinderId: cyl('LP'), end: 'crank', meanEffectivePressurePsi: 25.5, cutOffPercent: 42, admissionPressurePsig: 23.5 },
          ],
        });
      expect(res.status).toBe(201);
      const set = res.body as CardSetDto;
      expect(set.speedRpm).toBe(74.2);
      expect(set.speedSource).toBe('reading');
      expect(set.receiverPressurePsig).toBe(27);
      expect(set.vacuumSource).toBe('reading');

      // The set's numbers are the module's: computeIndicatedPower on the same cards.
      const hpTrace = calibrateTrace({
        atmosphericLine: trace.atmosphericLine,
        diagramStartPx: trace.admissionEndPx,
        diagramEndPx: trace.releaseEndPx,
        tracePx: trace.pointsPx,
        springPsiPerIn: 80,
        cardLengthIn: 3.5,
      });
      const expected = computeIndicatedPower({
        rpm: 74.2,
        strokeIn: 48,
        cylinders: [
          {
            label: 'HP',
            boreIn: 24,
            pistonRodIn: 5.5,
            tailRodIn: 0,
            cards: [
              { end: 'head', meanEffectivePressurePsi: hpTrace.meanEffectivePressurePsi },
              { end: 'crank', areaSqIn: 2.4, lengthIn: 3.5, springPsiPerIn: 80 },
            ],
          },
          {
            label: 'LP',
            boreIn: 44,
            pistonRodIn: 5.5,
            tailRodIn: 4,
            cards: [
              { end: 'head', ordinatesIn, springPsiPerIn: 20 },
              { end: 'crank', meanEffectivePressurePsi: 25.5 },
            ],
          },
        ],
      });
      expect(set.results.totalIndicatedHorsepower).toBeCloseTo(expected.totalIndicatedHorsepower, 9);
      expect(set.results.referredMeanEffectivePressurePsi).toBeCloseTo(expected.referredMeanEffectivePressurePsi!, 9);
      expect(set.results.complete).toBe(true);
      // Receiver drop: 27 psig less the LP cards' mean admission (24.5 + 23.5)/2 = 3 psi.
      expect(set.results.receiverDropPsi).toBeCloseTo(3, 9);
      expect(set.results.cylinders[0].ends[0].ideal).not.toBeNull();
      expect(set.results.cylinders[0].ends[0].diagramFactor).toBeGreaterThan(0);
      expect(set.results.cylinders[0].ends[0].steam?.expansionPressureBasis).toBe('trace');
      expect(set.results.steamAccountedForLbPerIhpHour).toBeGreaterThan(0);

      const event = await arrived;
      expect(event).toMatchObject({ runId: run.id, kind: 'card_set', id: set.id });
      expect((event.data as CardSetDto).results.totalIndicatedHorsepower).toBeCloseTo(set.results.totalIndicatedHorsepower, 9);
    });

    it('a traced card comes back as stored: the same points, the same calibration (tracing round trip)', async () => {
      const { imageId, trace } = await tracedCard();
      const res = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/card-sets`)
        .send({
          takenAt: takenAt(),
          speedRpm: 75,
          cards: [{ cylinderId: cyl('HP'), end: 'head', springPsiPerIn: 80, lengthIn: 3.5, imageId, trace, traceOrigin: 'adjusted' }],
        });
      expect(res.status).toBe(201);
      const list = (await signedIn(t, observer).get(`/api/runs/${run.id}/card-sets`)).body as CardSetDto[];
      const card = list.find((s) => s.id === res.body.id)!.cards[0];
      expect(card.method).toBe('trace');
      expect(card.imageId).toBe(imageId);
      expect(card.trace).toEqual(trace as CardTrace);
      expect(card.traceOrigin).toBe('adjusted');
      const again = calibrateTrace({
        atmosphericLine: card.trace!.atmosphericLine,
        diagramStartPx: card.trace!.admissionEndPx,
        diagramEndPx: card.trace!.releaseEndPx,
        tracePx: card.trace!.pointsPx,
        springPsiPerIn: 80,
        cardLengthIn: 3.5,
      });
      expect(card.meanEffectivePressurePsi).toBeCloseTo(again.meanEffectivePressurePsi, 12);
      expect(card.outline).toHaveLength(trace.pointsPx.length);
      // The set's results with only one end: incomplete, and it says which ends are missing.
      expect(list.find((s) => s.id === res.body.id)!.results.missingEnds).toHaveLength(3);
    });

    it('refuses a trace origin it does not know, naming the field', async () => {
      const { imageId, trace } = await tracedCard();
      const res = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/card-sets`)
        .send({
          takenAt: takenAt(),
          speedRpm: 75,
          cards: [{ cylinderId: cyl('HP'), end: 'head', springPsiPerIn: 80, lengthIn: 3.5, imageId, trace, traceOrigin: 'guessed' }],
        });
      expect(res.status).toBe(400);
      expect(JSON.stringify(res.body)).toContain('traceOrigin must be one of: proposed-accepted, adjusted, by-hand');
    });

    it('amends a card: the new figures count, the old ones stay visible with who, when and why', async () => {
      const created = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/card-sets`)
        .send({
          takenAt: takenAt(),
          speedRpm: 75,
          cards: [{ cylinderId: cyl('LP'), end: 'crank', areaSqIn: 4.6, lengthIn: 3.5, springPsiPerIn: 20 }],
        });
      const card = (created.body as CardSetDto).cards[0];
      const s = await observerSocket(run.id);
      const arrived = nextRecord(s, 'card_set');
      const res = await signedIn(t, chief)
        .post(`/api/cards/${card.id}/amendments`)
        .send({ areaSqIn: 4.51, lengthIn: 3.5, springPsiPerIn: 20, reason: 'Planimeter run again with the arm set right.' });
      expect(res.status).toBe(201);
      const amended = (res.body as CardSetDto).cards[0];
      // 4.51 in² ÷ 3.5 in × 20 psi/in = 25.771 psi (arithmetic).
      expect(amended.meanEffectivePressurePsi).toBeCloseTo((4.51 / 3.5) * 20, 9);
      expect(amended.amendments).toHaveLength(1);
      const a = amended.amendments[0];
      expect(a.reason).toBe('Planimeter run again with the arm set right.');
      expect(a.byName).toBe(chief.account.displayName);
      expect(Number.isNaN(Date.parse(a.at))).toBe(false);
      expect(a.changes).toEqual(expect.arrayContaining([{ field: 'areaSqIn', from: 4.6, to: 4.51 }]));
      expect(a.changes.find((c) => c.field === 'meanEffectivePressurePsi')?.from).toBeCloseTo((4.6 / 3.5) * 20, 9);
      expect((await arrived).id).toBe(created.body.id);

      expect(
        (await signedIn(t, chief).post(`/api/cards/${card.id}/amendments`).send({ areaSqIn: 4.51, lengthIn: 3.5, springPsiPerIn: 20 }))
          .status,
      ).toBe(400); // no reason
      expect(
        (
          await signedIn(t, observer)
            .post(`/api/cards/${card.id}/amendments`)
            .send({ areaSqIn: 4.5, lengthIn: 3.5, springPsiPerIn: 20, reason: 'observer try' })
        ).status,
      ).toBe(403);
    });

    it('adds a missing end, refuses a second card for an end (409) and a bad card (400 naming the field)', async () => {
      const created = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/card-sets`)
        .send({ takenAt: takenAt(), speedRpm: 75, cards: [{ cylinderId: cyl('HP'), end: 'head', meanEffectivePressurePsi: 55 }] });
      const id = created.body.id as string;
      const add = await signedIn(t, operator)
        .post(`/api/card-sets/${id}/cards`)
        .send({ cylinderId: cyl('HP'), end: 'crank', meanEffectivePressurePsi: 53 });
      expect(add.status).toBe(201);
      expect((add.body as CardSetDto).cards).toHaveLength(2);
      const again = await signedIn(t, operator)
        .post(`/api/card-sets/${id}/cards`)
        .send({ cylinderId: cyl('HP'), end: 'crank', meanEffectivePressurePsi: 50 });
      expect(again.status).toBe(409);
      const twoWays = await signedIn(t, operator)
        .post(`/api/card-sets/${id}/cards`)
        .send({ cylinderId: cyl('LP'), end: 'head', meanEffectivePressurePsi: 20, areaSqIn: 4, lengthIn: 3.5, springPsiPerIn: 20 });
      expect(twoWays.status).toBe(400);
      expect(twoWays.body.message.join(' ')).toMatch(/card\.areaSqIn/);
      const foreign = await signedIn(t, operator)
        .post(`/api/card-sets/${id}/cards`)
        .send({ cylinderId: randomUUID(), end: 'head', meanEffectivePressurePsi: 20 });
      expect(foreign.status).toBe(400);
      expect(foreign.body.message.join(' ')).toMatch(/card\.cylinderId/);
      const dup = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/card-sets`)
        .send({
          takenAt: takenAt(),
          speedRpm: 75,
          cards: [
            { cylinderId: cyl('HP'), end: 'head', meanEffectivePressurePsi: 55 },
            { cylinderId: cyl('HP'), end: 'head', meanEffectivePressurePsi: 54 },
          ],
        });
      expect(dup.status).toBe(400);
      expect(dup.body.message.join(' ')).toMatch(/cards\[1\]\.end: a second card for the HP head end/);
    });

    it('amends a set’s speed with a reason and keeps the old figure', async () => {
      const created = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/card-sets`)
        .send({ takenAt: takenAt(), speedRpm: 70, cards: [{ cylinderId: cyl('HP'), end: 'head', meanEffectivePressurePsi: 55 }] });
      const before = (created.body as CardSetDto).results.totalIndicatedHorsepower;
      const res = await signedIn(t, operator)
        .post(`/api/card-sets/${created.body.id}/amendments`)
        .send({ speedRpm: 75, reason: 'Speed read off the wrong counter.' });
      expect(res.status).toBe(201);
      const set = res.body as CardSetDto;
      // IHP is proportional to speed (P·L·A·N/33,000).
      expect(set.results.totalIndicatedHorsepower).toBeCloseTo((before * 75) / 70, 9);
      expect(set.amendments[0].changes).toEqual(expect.arrayContaining([{ field: 'speedRpm', from: 70, to: 75 }]));
    });

    it('turns the vacuum absolute against the run’s barometer reading: 24 inHg under 28.9 inHg is 2.41 psia', async () => {
      const sets = (body: object) => signedIn(t, operator).post(`/api/runs/${run.id}/card-sets/preview`).send(body);
      const cards = [
        { cylinderId: cyl('HP'), end: 'head', meanEffectivePressurePsi: 55 },
        { cylinderId: cyl('HP'), end: 'crank', meanEffectivePressurePsi: 53 },
      ];
      const entered = await sets({ takenAt: takenAt(), speedRpm: 75, vacuumInHg: 24, barometerInHg: 28.9, cards });
      expect(entered.status).toBe(200);
      expect(entered.body.barometerSource).toBe('entered');
      expect(entered.body.results.atmosphereBasis).toBe('barometer');
      expect(entered.body.results.cylinders[1].backPressurePsia).toBeCloseTo(2.41, 2);

      const at = new Date(Date.now() - 10 * 60_000).toISOString();
      const round = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: at, readings: [{ clientId: randomUUID(), pointId: point('BAR'), value: 28.9, takenAt: at }] });
      expect(round.status).toBe(201);
      const read = await sets({ takenAt: takenAt(), speedRpm: 75, vacuumInHg: 24, cards });
      expect(read.body.barometerSource).toBe('reading');
      expect(read.body.barometerInHg).toBe(28.9);
      expect(read.body.results.cylinders[1].backPressurePsia).toBeCloseTo(2.41, 2);
    });

    it('a brake figure gives the complete sets near it a mechanical efficiency; an incomplete set none, with the reason', async () => {
      const post = (cards: object[]) =>
        signedIn(t, operator).post(`/api/runs/${run.id}/card-sets`).send({ takenAt: takenAt(), speedRpm: 75, cards });
      const hpCards = [
        { cylinderId: cyl('HP'), end: 'head', meanEffectivePressurePsi: 55 },
        { cylinderId: cyl('HP'), end: 'crank', meanEffectivePressurePsi: 53 },
      ];
      const partial = await post(hpCards);
      const created = await post([
        ...hpCards,
        { cylinderId: cyl('LP'), end: 'head', meanEffectivePressurePsi: 26 },
        { cylinderId: cyl('LP'), end: 'crank', meanEffectivePressurePsi: 25 },
      ]);
      const ihp = (created.body as CardSetDto).results.totalIndicatedHorsepower;
      const res = await signedIn(t, chief)
        .post(`/api/runs/${run.id}/brake-figures`)
        .send({ measuredAt: takenAt(), method: 'direct', brakeHorsepower: 300 });
      expect(res.status).toBe(201);
      const set = (await signedIn(t, observer).get(`/api/card-sets/${created.body.id}`)).body as CardSetDto;
      expect(set.results.complete).toBe(true);
      expect(set.results.brake?.brakeHorsepower).toBe(300);
      expect(set.results.brake?.mechanicalEfficiency).toBeCloseTo(300 / ihp, 12);
      const incomplete = (await signedIn(t, observer).get(`/api/card-sets/${partial.body.id}`)).body as CardSetDto;
      expect(incomplete.results.complete).toBe(false);
      expect(incomplete.results.brake?.mechanicalEfficiency).toBeNull();
      expect(incomplete.results.brake?.mechanicalEfficiencyMissing).toMatch(/missing: LP head end, LP crank end/);
      const missing = await signedIn(t, chief)
        .post(`/api/runs/${run.id}/brake-figures`)
        .send({ measuredAt: takenAt(), method: 'torque', speedRpm: 75 });
      expect(missing.status).toBe(400);
      expect(missing.body.message.join(' ')).toMatch(/torqueLbfFt/);
    });

    it('an observer cannot take a set (403); a set without a speed or reading is refused naming speedRpm', async () => {
      const body = { takenAt: takenAt(), speedRpm: 75, cards: [] };
      expect((await signedIn(t, observer).post(`/api/runs/${run.id}/card-sets`).send(body)).status).toBe(403);
      const other = await createPreparingRun(t, operator.accessToken, (await createEngine(t, chief.accessToken, compoundBody())).id);
      const res = await signedIn(t, operator).post(`/api/runs/${other.id}/card-sets`).send({ takenAt: takenAt(), cards: [] });
      expect(res.status).toBe(400);
      expect(res.body.message.join(' ')).toMatch(/speedRpm: no speed reading/);
      expect((await signedIn(t, operator).post(`/api/runs/${randomUUID()}/card-sets`).send(body)).status).toBe(404);
    });

    it('a closed run refuses new sets and amendments (409)', async () => {
      const e = await createEngine(t, chief.accessToken, compoundBody());
      const r = await createPreparingRun(t, operator.accessToken, e.id);
      const created = await signedIn(t, operator)
        .post(`/api/runs/${r.id}/card-sets`)
        .send({ takenAt: takenAt(), speedRpm: 75, cards: [{ cylinderId: e.cylinders[0].id, end: 'head', meanEffectivePressurePsi: 55 }] });
      expect(created.status).toBe(201);
      // Closing needs the whole start and close procedure; the state is arranged directly for this test.
      await t.db.query(`UPDATE runs SET state = 'closed', closed_at = now() WHERE id = $1`, [r.id]);
      expect(
        (await signedIn(t, operator).post(`/api/runs/${r.id}/card-sets`).send({ takenAt: takenAt(), speedRpm: 75, cards: [] })).status,
      ).toBe(409);
      const cardId = (created.body as CardSetDto).cards[0].id;
      expect(
        (await signedIn(t, chief).post(`/api/cards/${cardId}/amendments`).send({ meanEffectivePressurePsi: 54, reason: 'too late now' }))
          .status,
      ).toBe(409);
      expect(
        (
          await signedIn(t, operator)
            .post(`/api/runs/${r.id}/card-images`)
            .set('content-type', 'image/png')
            .send(encodePng(2, 2, new Uint8Array(12)))
        ).status,
      ).toBe(409);
      // Still readable.
      expect((await signedIn(t, observer).get(`/api/runs/${r.id}/card-sets`)).status).toBe(200);
    });
  });

  describe('POST /api/calculations/indicator-trace', () => {
    it('calibrates a trace without storing it; a trace of two points is refused naming pointsPx', async () => {
      const drawn = drawIndicatorCard({
        seed: 'e2e-preview',
        end: 'crank',
        admissionPressurePsia: 39,
        backPressurePsia: 3.3,
        cutOffFraction: 0.42,
        clearanceFraction: 0.06,
        springPsiPerIn: 20,
        lengthIn: 3.5,
      });
      const res = await signedIn(t, observer)
        .post('/api/calculations/indicator-trace')
        .send({ trace: drawn.trace, springPsiPerIn: 20, lengthIn: 3.5 });
      expect(res.status).toBe(200);
      const direct = calibrateTrace({
        atmosphericLine: drawn.trace.atmosphericLine,
        diagramStartPx: drawn.trace.admissionEndPx,
        diagramEndPx: drawn.trace.releaseEndPx,
        tracePx: drawn.trace.pointsPx,
        springPsiPerIn: 20,
        cardLengthIn: 3.5,
      });
      expect(res.body.meanEffectivePressurePsi).toBeCloseTo(direct.meanEffectivePressurePsi, 12);
      expect(res.body.lengthIn).toBeCloseTo(3.5, 9);
      const bad = await signedIn(t, observer)
        .post('/api/calculations/indicator-trace')
        .send({ trace: { ...drawn.trace, pointsPx: drawn.trace.pointsPx.slice(0, 2) }, springPsiPerIn: 20, lengthIn: 3.5 });
      expect(bad.status).toBe(400);
      expect(bad.body.message.join(' ')).toMatch(/pointsPx/);
    });
  });
});
