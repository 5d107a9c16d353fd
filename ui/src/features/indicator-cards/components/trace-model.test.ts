import { addMark, emptyTrace, fromCardTrace, hitTest, movePoint, toCardTrace, traceMissing, traceStep } from './trace-model';

describe('the trace model', () => {
  it('takes clicks in order: atmospheric line (two), admission end, release end, then the outline', () => {
    let d = emptyTrace();
    expect(traceStep(d)).toBe('atmosphere');
    d = addMark(d, { x: 10, y: 300 });
    d = addMark(d, { x: 600, y: 304 });
    expect(traceStep(d)).toBe('admission');
    d = addMark(d, { x: 60, y: 301 });
    expect(traceStep(d)).toBe('release');
    d = addMark(d, { x: 550, y: 303 });
    expect(traceStep(d)).toBe('outline');
    expect(toCardTrace(d)).toBeNull();
    expect(traceMissing(d)).toBe('trace at least three points of the outline');
    d = addMark(addMark(addMark(d, { x: 60, y: 100 }), { x: 550, y: 250 }), { x: 60.04, y: 280.06 });
    const t = toCardTrace(d)!;
    expect(t.atmosphericLine).toEqual([
      { x: 10, y: 300 },
      { x: 600, y: 304 },
    ]);
    expect(t.admissionEndPx).toEqual({ x: 60, y: 301 });
    expect(t.releaseEndPx).toEqual({ x: 550, y: 303 });
    // Kept to a tenth of a pixel.
    expect(t.pointsPx[2]).toEqual({ x: 60, y: 280.1 });
    expect(traceMissing(d)).toBeNull();
    // Back from storage: the same draft.
    expect(toCardTrace(fromCardTrace(t))).toEqual(t);
  });

  it('finds the nearest mark within the grab radius, outline points first, and moves it', () => {
    const d = fromCardTrace({
      atmosphericLine: [
        { x: 0, y: 100 },
        { x: 400, y: 100 },
      ],
      admissionEndPx: { x: 20, y: 100 },
      releaseEndPx: { x: 380, y: 100 },
      pointsPx: [
        { x: 20, y: 20 },
        { x: 380, y: 80 },
        { x: 22, y: 95 },
      ],
    });
    expect(hitTest(d, { x: 21, y: 22 }, 5)).toEqual({ kind: 'point', index: 0 });
    expect(hitTest(d, { x: 200, y: 200 }, 5)).toBeNull();
    expect(hitTest(d, { x: 378, y: 101 }, 5)).toEqual({ kind: 'release' });
    expect(hitTest(d, { x: 21, y: 97 }, 5)).toEqual({ kind: 'point', index: 2 });
    const moved = movePoint(d, { kind: 'point', index: 1 }, { x: 390.26, y: 70 });
    expect(moved.pointsPx[1]).toEqual({ x: 390.3, y: 70 });
    expect(d.pointsPx[1]).toEqual({ x: 380, y: 80 }); // the original is untouched
    expect(movePoint(d, { kind: 'atmosphere', index: 1 }, { x: 410, y: 99 }).atmosphericLine[1]).toEqual({ x: 410, y: 99 });
  });
});
