import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { fireEvent, render, screen } from '../../../test-utils/render';
import { CardTracer } from './CardTracer';
import { emptyTrace, type TraceDraft } from './trace-model';

// An image of 400 × 200 px shown at 800 × 400 on screen: a screen pixel is half an image pixel.
const RECT = { left: 100, top: 50, width: 800, height: 400, right: 900, bottom: 450, x: 100, y: 50, toJSON: () => ({}) };

function Harness({ initial = emptyTrace(), onDraft }: { initial?: TraceDraft; onDraft?: (d: TraceDraft) => void }) {
  const [d, setD] = useState(initial);
  return (
    <CardTracer
      imageUrl="blob:card"
      widthPx={400}
      heightPx={200}
      value={d}
      onChange={(next) => {
        setD(next);
        onDraft?.(next);
      }}
    />
  );
}

function surface() {
  const svg = screen.getByTestId('card-tracer-surface');
  svg.getBoundingClientRect = () => RECT as DOMRect;
  return svg;
}
/** A click at image pixel (x, y). */
function clickAt(svg: HTMLElement, x: number, y: number) {
  const clientX = RECT.left + x * 2;
  const clientY = RECT.top + y * 2;
  fireEvent.pointerDown(svg, { clientX, clientY, button: 0, pointerId: 1 });
  fireEvent.pointerUp(svg, { clientX, clientY, button: 0, pointerId: 1 });
}

describe('CardTracer', () => {
  it('walks through calibration and tracing by clicks, in image pixels whatever the screen size', () => {
    const seen: TraceDraft[] = [];
    render(<Harness onDraft={(d) => seen.push(d)} />);
    const svg = surface();
    expect(screen.getByTestId('tracer-step')).toHaveTextContent('Atmospheric line 0/2');
    clickAt(svg, 10, 150);
    clickAt(svg, 390, 152);
    expect(screen.getAllByTestId('tracer-atm-mark')).toHaveLength(2);
    expect(screen.getByTestId('tracer-instruction')).toHaveTextContent(/admission end/);
    clickAt(svg, 40, 150);
    clickAt(svg, 360, 151);
    expect(screen.getByTestId('tracer-step')).toHaveTextContent('Outline: 0 points');
    clickAt(svg, 40, 40);
    clickAt(svg, 360, 120);
    clickAt(svg, 40, 130);
    expect(screen.getAllByTestId('tracer-point')).toHaveLength(3);
    const last = seen[seen.length - 1];
    expect(last.atmosphericLine).toEqual([
      { x: 10, y: 150 },
      { x: 390, y: 152 },
    ]);
    expect(last.pointsPx).toEqual([
      { x: 40, y: 40 },
      { x: 360, y: 120 },
      { x: 40, y: 130 },
    ]);
  });

  it('undoes the last change, and drags a point to move it without adding one', async () => {
    const user = userEvent.setup();
    const initial: TraceDraft = {
      atmosphericLine: [
        { x: 10, y: 150 },
        { x: 390, y: 152 },
      ],
      admissionEndPx: { x: 40, y: 150 },
      releaseEndPx: { x: 360, y: 151 },
      pointsPx: [
        { x: 40, y: 40 },
        { x: 360, y: 120 },
      ],
    };
    const seen: TraceDraft[] = [];
    render(<Harness initial={initial} onDraft={(d) => seen.push(d)} />);
    const svg = surface();
    clickAt(svg, 40, 130);
    expect(screen.getAllByTestId('tracer-point')).toHaveLength(3);
    await user.click(screen.getByRole('button', { name: 'Undo' }));
    expect(screen.getAllByTestId('tracer-point')).toHaveLength(2);

    // Press on the point at (360, 120), drag to (300, 100) image pixels, let go.
    fireEvent.pointerDown(svg, { clientX: RECT.left + 720, clientY: RECT.top + 240, button: 0, pointerId: 1 });
    fireEvent.pointerMove(svg, { clientX: RECT.left + 660, clientY: RECT.top + 220, pointerId: 1 });
    fireEvent.pointerUp(svg, { clientX: RECT.left + 600, clientY: RECT.top + 200, button: 0, pointerId: 1 });
    expect(screen.getAllByTestId('tracer-point')).toHaveLength(2);
    expect(seen[seen.length - 1].pointsPx[1]).toEqual({ x: 300, y: 100 });
    await user.click(screen.getByRole('button', { name: 'Undo' }));
    expect(seen[seen.length - 1].pointsPx[1]).toEqual({ x: 360, y: 120 });
  });

  it('zooms in and out and back to the width', async () => {
    const user = userEvent.setup();
    render(<Harness />);
    const before = screen.getByTestId('tracer-zoom').textContent;
    await user.click(screen.getByRole('button', { name: 'Zoom in' }));
    const zoomed = screen.getByTestId('tracer-zoom').textContent;
    expect(zoomed).not.toBe(before);
    expect(Number(zoomed!.replace('%', ''))).toBeGreaterThan(Number(before!.replace('%', '')));
    await user.click(screen.getByRole('button', { name: 'Zoom out' }));
    await user.click(screen.getByRole('button', { name: 'Zoom out' }));
    expect(Number(screen.getByTestId('tracer-zoom').textContent!.replace('%', ''))).toBeLessThan(Number(zoomed!.replace('%', '')));
    await user.click(screen.getByRole('button', { name: 'Fit the width' }));
    expect(screen.getByTestId('tracer-zoom').textContent).toBe(before);
  });

  it('read-only: a click adds nothing and there is no undo', () => {
    const seen: TraceDraft[] = [];
    render(<CardTracer imageUrl="blob:card" widthPx={400} heightPx={200} value={emptyTrace()} onChange={(d) => seen.push(d)} readOnly />);
    clickAt(surface(), 20, 20);
    expect(seen).toHaveLength(0);
    expect(screen.queryByRole('button', { name: 'Undo' })).toBeNull();
  });
});
