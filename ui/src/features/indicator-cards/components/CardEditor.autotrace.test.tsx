import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import type { AutotraceProposal } from '@crankjournal/shared-types';
import { stubFetch, signIn } from '../../../test-utils/http';
import { fireEvent, render, screen, waitFor } from '../../../test-utils/render';
import { CardEditor } from './CardEditor';
import { draftToInput, emptyCard, type CardDraft } from './card-draft';

const proposeTraceInBrowser = vi.fn<(file: Blob) => Promise<AutotraceProposal>>();
vi.mock('../model/autotrace', () => ({ proposeTraceInBrowser: (file: Blob) => proposeTraceInBrowser(file) }));

const PROPOSAL: AutotraceProposal = {
  found: true,
  atmosphericLine: [
    { x: 10, y: 150 },
    { x: 390, y: 152 },
  ],
  admissionEndPx: { x: 40, y: 150 },
  releaseEndPx: { x: 360, y: 151 },
  pointsPx: [
    { x: 40, y: 40 },
    { x: 360, y: 120 },
    { x: 40, y: 130 },
  ],
  confidence: 0.62,
  reasons: [{ code: 'several-loops', message: 'The diagram has loops; check the proposed outline where its lines cross.' }],
  loops: 2,
};

// The image (400 × 200 px) shown at 800 × 400 on screen.
const RECT = { left: 100, top: 50, width: 800, height: 400, right: 900, bottom: 450, x: 100, y: 50, toJSON: () => ({}) };

function Harness({ onDraft }: { onDraft: (d: CardDraft) => void }) {
  const [d, setD] = useState(emptyCard({ method: 'trace', springPsiPerIn: 60, lengthIn: 3.5 }));
  return (
    <CardEditor
      runId="run-1"
      title="HP head end"
      draft={d}
      onChange={(next) => {
        setD(next);
        onDraft(next);
      }}
    />
  );
}

async function upload() {
  const seen: CardDraft[] = [];
  const { container } = render(<Harness onDraft={(d) => seen.push(d)} />);
  const input = container.querySelector('input[type=file]') as HTMLInputElement;
  await userEvent.upload(input, new File(['png'], 'card.png', { type: 'image/png' }));
  return { seen, last: () => seen[seen.length - 1] };
}

describe('CardEditor: the proposed trace of an uploaded photo', () => {
  beforeEach(() => {
    signIn('operator');
    stubFetch({ 'POST /runs/:id/card-images': { id: '00000000-0000-4000-8000-000000000001', widthPx: 400, heightPx: 200 } });
    URL.createObjectURL = vi.fn(() => 'blob:card');
    proposeTraceInBrowser.mockReset();
  });

  it('shows the proposal with its confidence and reasons; accepting it makes the card complete, marked as accepted', async () => {
    proposeTraceInBrowser.mockResolvedValue(PROPOSAL);
    const { last } = await upload();
    expect(await screen.findByTestId('autotrace-proposal')).toBeInTheDocument();
    expect(screen.getByTestId('autotrace-confidence')).toHaveTextContent('confidence 62 %: check it');
    expect(screen.getByTestId('autotrace-reasons')).toHaveTextContent(/loops/);
    expect(screen.getAllByTestId('tracer-point')).toHaveLength(3);
    expect(screen.getByTestId('card-missing')).toHaveTextContent('accept the proposed trace, adjust it or trace by hand');
    expect(draftToInput(last(), 'cyl', 'head')).toBeNull();

    await userEvent.click(screen.getByRole('button', { name: 'Accept the proposed trace' }));
    expect(last().traceOrigin).toBe('proposed-accepted');
    const input = draftToInput(last(), 'cyl', 'head')!;
    expect(input.traceOrigin).toBe('proposed-accepted');
    expect(input.trace!.pointsPx).toEqual(PROPOSAL.pointsPx);
    expect(screen.getByTestId('autotrace-origin')).toHaveTextContent('traced automatically, accepted');
  });

  it('dragging a point of the proposal makes it adjusted; a click beside it adds no point', async () => {
    proposeTraceInBrowser.mockResolvedValue(PROPOSAL);
    const { last } = await upload();
    await screen.findByTestId('autotrace-proposal');
    const svg = screen.getByTestId('card-tracer-surface');
    svg.getBoundingClientRect = () => RECT as DOMRect;
    // A click well away from every mark: nothing is added to a proposed outline.
    fireEvent.pointerDown(svg, { clientX: 100 + 200 * 2, clientY: 50 + 80 * 2, button: 0, pointerId: 1 });
    fireEvent.pointerUp(svg, { clientX: 100 + 200 * 2, clientY: 50 + 80 * 2, button: 0, pointerId: 1 });
    expect(screen.getAllByTestId('tracer-point')).toHaveLength(3);
    // Drag the point at (360, 120) to (350, 110).
    fireEvent.pointerDown(svg, { clientX: 100 + 360 * 2, clientY: 50 + 120 * 2, button: 0, pointerId: 1 });
    fireEvent.pointerMove(svg, { clientX: 100 + 350 * 2, clientY: 50 + 110 * 2, pointerId: 1 });
    fireEvent.pointerUp(svg, { clientX: 100 + 350 * 2, clientY: 50 + 110 * 2, button: 0, pointerId: 1 });
    await waitFor(() => expect(last().traceOrigin).toBe('adjusted'));
    expect(last().trace.pointsPx[1]).toEqual({ x: 350, y: 110 });
    expect(draftToInput(last(), 'cyl', 'head')!.traceOrigin).toBe('adjusted');
  });

  it('"Trace by hand" clears the proposal for clicks, and the proposal can be taken back', async () => {
    proposeTraceInBrowser.mockResolvedValue(PROPOSAL);
    const { last } = await upload();
    await screen.findByTestId('autotrace-proposal');
    await userEvent.click(screen.getByRole('button', { name: 'Trace by hand' }));
    expect(last().traceOrigin).toBe('by-hand');
    expect(last().trace.pointsPx).toEqual([]);
    expect(screen.getByTestId('tracer-step')).toHaveTextContent('Atmospheric line 0/2');
    await userEvent.click(screen.getByRole('button', { name: 'Use the proposed trace instead' }));
    expect(last().traceOrigin).toBeNull();
    expect(last().trace.pointsPx).toEqual(PROPOSAL.pointsPx);
  });

  it('a refused photo says why and leaves the tracer to the hand, which marks the trace as by hand', async () => {
    proposeTraceInBrowser.mockResolvedValue({
      ...PROPOSAL,
      found: false,
      atmosphericLine: null,
      admissionEndPx: null,
      releaseEndPx: null,
      pointsPx: [],
      confidence: 0,
      reasons: [{ code: 'two-diagrams', message: 'Two closed curves of similar size were found: photograph one diagram per card.' }],
    });
    const { last } = await upload();
    expect(await screen.findByTestId('autotrace-refused')).toHaveTextContent('Two closed curves');
    const svg = screen.getByTestId('card-tracer-surface');
    svg.getBoundingClientRect = () => RECT as DOMRect;
    fireEvent.pointerDown(svg, { clientX: 120, clientY: 350, button: 0, pointerId: 1 });
    fireEvent.pointerUp(svg, { clientX: 120, clientY: 350, button: 0, pointerId: 1 });
    expect(last().traceOrigin).toBe('by-hand');
    expect(last().trace.atmosphericLine).toHaveLength(1);
  });
});
