import { useCallback, useEffect, useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import { ActionIcon, Badge, Box, Button, Group, Stack, Text, Tooltip } from '@mantine/core';
import { useElementSize } from '@mantine/hooks';
import { IconArrowBackUp, IconTrash, IconZoomIn, IconZoomOut, IconZoomReset } from '@tabler/icons-react';
import type { TracePoint } from '@crankjournal/shared-types';
import { addMark, hitTest, movePoint, STEP_WORDS, traceStep, type TraceDraft, type TraceTarget } from './trace-model';

const ZOOMS = [0.5, 0.75, 1, 1.5, 2, 3, 4];
/** How near (screen pixels) a press must be to a mark to grab it; a glove is not a stylus. */
const GRAB_PX = 16;
/** A press that moves less than this (screen pixels) is a click, not a drag. */
const CLICK_SLOP_PX = 5;

export interface CardTracerProps {
  imageUrl: string;
  widthPx: number;
  heightPx: number;
  value: TraceDraft;
  onChange: (next: TraceDraft) => void;
  /** Shown read-only (reviewing a stored trace without the right to change it). */
  readOnly?: boolean;
  /**
   * Whether a click on the card adds an outline point (tracing by hand). Off for a proposed outline, whose
   * points are only dragged: a stray click would add a point out of order.
   */
  appendOnClick?: boolean;
  /** Words under the tools in place of the step's own (e.g. how to adjust a proposal). */
  instruction?: string;
}

interface Press {
  clientX: number;
  clientY: number;
  target: TraceTarget | null;
  moved: boolean;
  before: TraceDraft;
}

/**
 * Traces an indicator card on its photo or scan: mark the atmospheric line and the two ends of the diagram
 * (the calibration), then click round the outline. Points can be dragged, the last change undone, the image
 * zoomed. Coordinates are kept in the image's own pixels whatever the zoom.
 */
export function CardTracer({ imageUrl, widthPx, heightPx, value, onChange, readOnly, appendOnClick = true, instruction }: CardTracerProps) {
  const { ref: boxRef, width: boxWidth } = useElementSize();
  const svgRef = useRef<SVGSVGElement>(null);
  const [zoomIndex, setZoomIndex] = useState<number | null>(null); // null: fit the width
  const [history, setHistory] = useState<TraceDraft[]>([]);
  const press = useRef<Press | null>(null);
  const [dragging, setDragging] = useState(false);

  const fit = boxWidth > 0 ? Math.min(1.5, boxWidth / widthPx) : 1;
  const scale = zoomIndex === null ? fit : ZOOMS[zoomIndex];
  const step = traceStep(value);

  const commit = useCallback(
    (next: TraceDraft, before: TraceDraft) => {
      setHistory((h) => [...h.slice(-99), before]);
      onChange(next);
    },
    [onChange],
  );
  const undo = useCallback(() => {
    if (!history.length) return;
    onChange(history[history.length - 1]);
    setHistory(history.slice(0, -1));
  }, [history, onChange]);

  useEffect(() => {
    if (readOnly) return;
    const onKey = (e: KeyboardEvent) => {
      if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === 'z') {
        e.preventDefault();
        undo();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [undo, readOnly]);

  /** Screen position → image pixels, whatever the zoom. */
  const toImage = (clientX: number, clientY: number): TracePoint => {
    const r = svgRef.current!.getBoundingClientRect();
    return { x: ((clientX - r.left) / r.width) * widthPx, y: ((clientY - r.top) / r.height) * heightPx };
  };
  const screenScale = () => {
    const r = svgRef.current?.getBoundingClientRect();
    return r && r.width > 0 ? r.width / widthPx : scale;
  };

  const onPointerDown = (e: ReactPointerEvent<SVGSVGElement>) => {
    if (readOnly || e.button > 0) return;
    const p = toImage(e.clientX, e.clientY);
    const target = hitTest(value, p, GRAB_PX / screenScale());
    press.current = { clientX: e.clientX, clientY: e.clientY, target, moved: false, before: value };
    if (target) {
      setDragging(true);
      e.currentTarget.setPointerCapture?.(e.pointerId);
    }
  };
  const onPointerMove = (e: ReactPointerEvent<SVGSVGElement>) => {
    const pr = press.current;
    if (!pr?.target) return;
    if (!pr.moved && Math.hypot(e.clientX - pr.clientX, e.clientY - pr.clientY) < CLICK_SLOP_PX) return;
    pr.moved = true;
    onChange(movePoint(value, pr.target, toImage(e.clientX, e.clientY)));
  };
  const onPointerUp = (e: ReactPointerEvent<SVGSVGElement>) => {
    const pr = press.current;
    press.current = null;
    setDragging(false);
    if (!pr || readOnly) return;
    if (pr.target) {
      if (pr.moved) commit(movePoint(value, pr.target, toImage(e.clientX, e.clientY)), pr.before);
      return;
    }
    if (Math.hypot(e.clientX - pr.clientX, e.clientY - pr.clientY) >= CLICK_SLOP_PX) return;
    if (!appendOnClick && step === 'outline') return;
    commit(addMark(value, toImage(e.clientX, e.clientY)), value);
  };

  const r = 6 / scale; // marks keep their size on screen
  // A proposed outline has a point every few pixels: drawn smaller, they still show where to grab.
  const pointR = value.pointsPx.length > 40 ? r / 2 : r;
  const stroke = 2 / scale;
  const atm = value.atmosphericLine;
  // The atmospheric line drawn across the whole image once both points are marked.
  let atmLine: [TracePoint, TracePoint] | null = null;
  if (atm.length === 2 && atm[0].x !== atm[1].x) {
    const k = (atm[1].y - atm[0].y) / (atm[1].x - atm[0].x);
    atmLine = [
      { x: 0, y: atm[0].y - k * atm[0].x },
      { x: widthPx, y: atm[0].y + k * (widthPx - atm[0].x) },
    ];
  }
  const outline = value.pointsPx.map((p) => `${p.x},${p.y}`).join(' ');
  const endMark = (p: TracePoint, letter: string, testId: string) => (
    <g data-testid={testId}>
      <line x1={p.x} x2={p.x} y1={p.y - 4 * r} y2={p.y + 4 * r} stroke="var(--mantine-color-brass-5)" strokeWidth={stroke} />
      <circle cx={p.x} cy={p.y} r={r * 1.3} fill="var(--mantine-color-brass-5)" />
      <text x={p.x + 2 * r} y={p.y - 2 * r} fontSize={14 / scale} fontWeight={700} fill="var(--mantine-color-brass-6)">
        {letter}
      </text>
    </g>
  );

  return (
    <Stack gap="xs">
      <Group justify="space-between" wrap="wrap" gap="xs">
        <Group gap="xs">
          <Badge variant="light" color={step === 'outline' ? 'copper' : 'brass'} size="lg" data-testid="tracer-step">
            {step === 'atmosphere'
              ? `Atmospheric line ${atm.length}/2`
              : step === 'admission'
                ? 'Admission end'
                : step === 'release'
                  ? 'Release end'
                  : `Outline: ${value.pointsPx.length} points`}
          </Badge>
        </Group>
        {!readOnly && (
          <Group gap={6}>
            <Button variant="default" leftSection={<IconArrowBackUp size={18} />} onClick={undo} disabled={!history.length} h={48}>
              Undo
            </Button>
            <Button
              variant="default"
              leftSection={<IconTrash size={18} />}
              h={48}
              disabled={!value.pointsPx.length}
              onClick={() => commit({ ...value, pointsPx: [] }, value)}
            >
              Clear outline
            </Button>
            <Button
              variant="default"
              h={48}
              disabled={!atm.length && !value.admissionEndPx}
              onClick={() => commit({ ...value, atmosphericLine: [], admissionEndPx: null, releaseEndPx: null }, value)}
            >
              Mark calibration again
            </Button>
          </Group>
        )}
        <Group gap={4}>
          <Tooltip label="Zoom out">
            <ActionIcon
              variant="default"
              aria-label="Zoom out"
              onClick={() => setZoomIndex(Math.max(0, (zoomIndex ?? ZOOMS.findIndex((z) => z >= scale)) - 1))}
            >
              <IconZoomOut />
            </ActionIcon>
          </Tooltip>
          <Text fz="sm" w={48} ta="center" className="cj-num" data-testid="tracer-zoom">
            {Math.round(scale * 100)}%
          </Text>
          <Tooltip label="Zoom in">
            <ActionIcon
              variant="default"
              aria-label="Zoom in"
              onClick={() =>
                setZoomIndex(Math.min(ZOOMS.length - 1, (zoomIndex ?? Math.max(0, ZOOMS.findIndex((z) => z > scale) - 1)) + 1))
              }
            >
              <IconZoomIn />
            </ActionIcon>
          </Tooltip>
          <Tooltip label="Fit the width">
            <ActionIcon variant="default" aria-label="Fit the width" onClick={() => setZoomIndex(null)}>
              <IconZoomReset />
            </ActionIcon>
          </Tooltip>
        </Group>
      </Group>
      {!readOnly && (
        <Text fz="sm" data-testid="tracer-instruction">
          {instruction ?? STEP_WORDS[step]}
        </Text>
      )}
      <Box
        ref={boxRef}
        style={{
          overflow: 'auto',
          maxHeight: '70vh',
          border: '1px solid var(--mantine-color-default-border)',
          borderRadius: 4,
          touchAction: dragging ? 'none' : 'pan-x pan-y',
        }}
      >
        <Box style={{ position: 'relative', width: widthPx * scale, height: heightPx * scale }}>
          <img
            src={imageUrl}
            alt="Indicator card"
            width={widthPx * scale}
            height={heightPx * scale}
            draggable={false}
            style={{ display: 'block', userSelect: 'none' }}
          />
          <svg
            ref={svgRef}
            viewBox={`0 0 ${widthPx} ${heightPx}`}
            width={widthPx * scale}
            height={heightPx * scale}
            style={{
              position: 'absolute',
              inset: 0,
              cursor: readOnly ? 'default' : dragging ? 'grabbing' : 'crosshair',
              touchAction: 'none',
            }}
            onPointerDown={onPointerDown}
            onPointerMove={onPointerMove}
            onPointerUp={onPointerUp}
            onPointerCancel={() => {
              press.current = null;
              setDragging(false);
            }}
            role="application"
            aria-label="Card image: click to mark and trace"
            data-testid="card-tracer-surface"
          >
            {atmLine && (
              <line
                x1={atmLine[0].x}
                y1={atmLine[0].y}
                x2={atmLine[1].x}
                y2={atmLine[1].y}
                stroke="var(--mantine-color-brass-5)"
                strokeWidth={stroke}
                strokeDasharray={`${8 / scale} ${5 / scale}`}
              />
            )}
            {atm.map((p, i) => (
              <rect
                key={`a${i}`}
                x={p.x - r}
                y={p.y - r}
                width={2 * r}
                height={2 * r}
                fill="var(--mantine-color-brass-5)"
                data-testid="tracer-atm-mark"
              />
            ))}
            {value.admissionEndPx && endMark(value.admissionEndPx, 'A', 'tracer-admission-mark')}
            {value.releaseEndPx && endMark(value.releaseEndPx, 'R', 'tracer-release-mark')}
            {value.pointsPx.length > 2 && (
              <polygon
                points={outline}
                fill="var(--mantine-color-copper-4)"
                fillOpacity={0.22}
                stroke="var(--mantine-color-copper-6)"
                strokeWidth={stroke}
              />
            )}
            {value.pointsPx.length === 2 && (
              <polyline points={outline} fill="none" stroke="var(--mantine-color-copper-6)" strokeWidth={stroke} />
            )}
            {value.pointsPx.map((p, i) => (
              <circle
                key={`p${i}`}
                cx={p.x}
                cy={p.y}
                r={pointR}
                fill={i === 0 ? 'var(--mantine-color-copper-7)' : 'var(--mantine-color-copper-4)'}
                stroke="#fff"
                strokeWidth={stroke / 2}
                data-testid="tracer-point"
              />
            ))}
          </svg>
        </Box>
      </Box>
    </Stack>
  );
}
