import { useEffect, useRef } from 'react';

/** Degrees the wheel turns in `ms` milliseconds at `rpm` revolutions per minute (360° per turn). */
export function flywheelDegrees(rpm: number, ms: number): number {
  return (rpm * 360 * ms) / 60_000;
}

const SPOKES = 6;

/**
 * Our own drawing of the engine's flywheel, turning at the engine's speed (requestAnimationFrame, so it keeps
 * time whatever the screen's refresh rate). Still when the engine rests or the visitor asks for reduced motion.
 */
export function Flywheel({ rpm, size = 220 }: { rpm: number | null; size?: number }) {
  const wheel = useRef<SVGGElement>(null);
  const angle = useRef(0);
  const speed = useRef(rpm ?? 0);
  speed.current = rpm ?? 0;

  useEffect(() => {
    if (typeof window === 'undefined' || typeof window.requestAnimationFrame !== 'function') return;
    if (window.matchMedia?.('(prefers-reduced-motion: reduce)').matches) return;
    let frame = 0;
    let last: number | null = null;
    const step = (now: number) => {
      if (last !== null) angle.current = (angle.current + flywheelDegrees(speed.current, now - last)) % 360;
      last = now;
      wheel.current?.setAttribute('transform', `rotate(${angle.current.toFixed(2)} 100 100)`);
      frame = window.requestAnimationFrame(step);
    };
    frame = window.requestAnimationFrame(step);
    return () => window.cancelAnimationFrame(frame);
  }, []);

  const spokes = Array.from({ length: SPOKES }, (_, i) => (i * 360) / SPOKES);
  return (
    <svg
      viewBox="0 0 200 200"
      width={size}
      height={size}
      role="img"
      aria-label={rpm ? `The flywheel turning at ${Math.round(rpm)} turns a minute` : 'The flywheel, at rest'}
    >
      <g ref={wheel} data-testid="flywheel-wheel">
        <circle cx="100" cy="100" r="88" fill="none" stroke="currentColor" strokeWidth="14" />
        <circle cx="100" cy="100" r="79" fill="none" stroke="currentColor" strokeWidth="2" opacity="0.5" />
        {spokes.map((a) => (
          <path key={a} d="M 95 100 L 97 22 L 103 22 L 105 100 Z" fill="currentColor" transform={`rotate(${a} 100 100)`} opacity="0.85" />
        ))}
        <circle cx="100" cy="100" r="18" fill="currentColor" />
        <circle cx="100" cy="100" r="7" fill="var(--cj-brass, #b08a2e)" />
        <circle cx="100" cy="20" r="4" fill="var(--cj-brass, #b08a2e)" />
      </g>
    </svg>
  );
}
