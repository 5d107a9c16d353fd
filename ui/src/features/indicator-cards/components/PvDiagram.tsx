import { Box, Text } from '@mantine/core';
import type { CardOutlinePointDto } from '@crankjournal/shared-types';
import { formatNumber } from '../../units/units';

const W = 420;
const H = 250;
const PAD = { left: 46, right: 12, top: 12, bottom: 34 };

/** Round steps for a pressure axis (psi): 1, 2, 5 × 10ⁿ, about five ticks. */
export function niceTicks(min: number, max: number, count = 5): number[] {
  const span = Math.max(max - min, 1e-9);
  const raw = span / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let v = Math.ceil(min / step) * step; v <= max + 1e-9; v += step) out.push(Math.abs(v) < 1e-9 ? 0 : v);
  return out;
}

export interface PvDiagramProps {
  /** The card as traced (stroke fraction across, psig up); null when the card gives no outline. */
  outline: CardOutlinePointDto[] | null;
  /** The ideal card for the recorded admission pressure, cut-off and back pressure (psig). */
  ideal: CardOutlinePointDto[] | null;
  label: string;
}

/**
 * A card as a pressure–volume diagram: the traced outline over the ideal card, which is drawn thin and
 * dashed; the atmospheric line at 0 psig. Pressure in psi gauge up, swept volume (fraction of stroke) across.
 */
export function PvDiagram({ outline, ideal, label }: PvDiagramProps) {
  const all = [...(outline ?? []), ...(ideal ?? [])];
  if (all.length === 0) {
    return (
      <Text fz="sm" c="dimmed" data-testid="pv-empty">
        No outline to draw: this card’s mean pressure came from figures, and no ideal card could be drawn for it.
      </Text>
    );
  }
  const pMax = Math.max(0, ...all.map((p) => p.pressurePsig));
  const pMin = Math.min(0, ...all.map((p) => p.pressurePsig));
  const margin = (pMax - pMin) * 0.06 || 1;
  const lo = pMin - margin;
  const hi = pMax + margin;
  const x = (f: number) => PAD.left + Math.max(-0.05, Math.min(1.05, f)) * (W - PAD.left - PAD.right);
  const y = (p: number) => PAD.top + ((hi - p) / (hi - lo)) * (H - PAD.top - PAD.bottom);
  const path = (pts: CardOutlinePointDto[]) =>
    pts.map((p) => `${x(p.strokeFraction).toFixed(1)},${y(p.pressurePsig).toFixed(1)}`).join(' ');
  const ticks = niceTicks(lo, hi);
  return (
    <Box>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        width="100%"
        role="img"
        aria-label={label}
        data-testid="pv-diagram"
        style={{ display: 'block', maxHeight: 280 }}
      >
        <title>{label}</title>
        {ticks.map((t) => (
          <g key={t}>
            <line x1={PAD.left} x2={W - PAD.right} y1={y(t)} y2={y(t)} stroke="var(--mantine-color-default-border)" strokeWidth={0.6} />
            <text x={PAD.left - 6} y={y(t) + 4} textAnchor="end" fontSize={11} fill="var(--mantine-color-dimmed)">
              {formatNumber(t, 0)}
            </text>
          </g>
        ))}
        {[0, 0.25, 0.5, 0.75, 1].map((f) => (
          <text key={f} x={x(f)} y={H - PAD.bottom + 15} textAnchor="middle" fontSize={11} fill="var(--mantine-color-dimmed)">
            {formatNumber(f * 100, 0)}%
          </text>
        ))}
        <text x={(PAD.left + W - PAD.right) / 2} y={H - 4} textAnchor="middle" fontSize={11} fill="var(--mantine-color-dimmed)">
          Volume swept, % of stroke (admission end at left)
        </text>
        <text
          x={12}
          y={PAD.top + (H - PAD.top - PAD.bottom) / 2}
          textAnchor="middle"
          fontSize={11}
          fill="var(--mantine-color-dimmed)"
          transform={`rotate(-90 12 ${PAD.top + (H - PAD.top - PAD.bottom) / 2})`}
        >
          psig
        </text>
        {/* Atmospheric line */}
        <line
          x1={PAD.left}
          x2={W - PAD.right}
          y1={y(0)}
          y2={y(0)}
          stroke="var(--mantine-color-text)"
          strokeWidth={1}
          data-testid="pv-atmospheric"
        />
        {ideal && ideal.length > 1 && (
          <polygon
            points={path(ideal)}
            fill="none"
            stroke="var(--mantine-color-brass-6)"
            strokeWidth={1.2}
            strokeDasharray="5 4"
            data-testid="pv-ideal"
          />
        )}
        {outline && outline.length > 2 && (
          <polygon
            points={path(outline)}
            fill="var(--mantine-color-copper-4)"
            fillOpacity={0.18}
            stroke="var(--mantine-color-copper-5)"
            strokeWidth={2}
            strokeLinejoin="round"
            data-testid="pv-card"
          />
        )}
      </svg>
      <Text fz="xs" c="dimmed">
        {outline ? 'Solid: the card as traced.' : 'No traced outline (mean pressure from figures).'}{' '}
        {ideal ? 'Dashed: the ideal card (hyperbolic expansion, no clearance).' : ''}
      </Text>
    </Box>
  );
}
