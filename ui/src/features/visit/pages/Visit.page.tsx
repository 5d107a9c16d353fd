import { useEffect, useState, type CSSProperties, type ReactNode } from 'react';
import { useParams, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Box, Button, Group, Image, Loader, SegmentedControl, Stack, Text, Title, useMantineColorScheme } from '@mantine/core';
import type { VisitorBoardView, VisitorFigures } from '@crankjournal/shared-types';
import { HttpError } from '../../../api/http';
import { openVisitSocket, visitViewQuery } from '../api/visit.api';
import { Flywheel } from '../components/Flywheel';
import { figureTexts, unitsForLocale, type VisitorUnits } from '../model/visitor-units';

const UNITS_KEY = 'cj-visit-units';

function storedUnits(): VisitorUnits | null {
  try {
    const v = window.localStorage.getItem(UNITS_KEY);
    return v === 'metric' || v === 'imperial' ? v : null;
  } catch {
    return null;
  }
}

/** Keeps the screen awake while `on` (Screen Wake Lock API, where the browser has it), again after the tab returns. */
function useWakeLock(on: boolean) {
  useEffect(() => {
    const nav = navigator as Navigator & { wakeLock?: { request(type: 'screen'): Promise<{ release(): Promise<void> }> } };
    if (!on || !nav.wakeLock) return;
    let lock: { release(): Promise<void> } | null = null;
    let ended = false;
    const take = () => {
      if (document.visibilityState !== 'visible') return;
      nav
        .wakeLock!.request('screen')
        .then((l) => {
          if (ended) void l.release();
          else lock = l;
        })
        .catch(() => undefined);
    };
    take();
    document.addEventListener('visibilitychange', take);
    return () => {
      ended = true;
      document.removeEventListener('visibilitychange', take);
      void lock?.release().catch(() => undefined);
    };
  }, [on]);
}

/** Dark while the wall mode is shown; the visitor's own scheme again afterwards. */
function useDarkWhile(on: boolean) {
  const { colorScheme, setColorScheme } = useMantineColorScheme();
  useEffect(() => {
    if (!on) return;
    const before = colorScheme;
    setColorScheme('dark');
    return () => setColorScheme(before);
    // Only when the mode changes: the scheme set here must not re-run it.
    // eslint-disable-next-line react-hooks/exhaustive-deps -- colorScheme is read once, when the wall mode starts
  }, [on, setColorScheme]);
}

function Figure({ label, value, unit, big }: { label: string; value: string; unit: string; big: boolean }) {
  return (
    <Box
      style={{ borderTop: '2px solid var(--cj-rule)', paddingTop: big ? 12 : 8 }}
      role="group"
      aria-label={label}
      data-testid={`figure-${label}`}
    >
      <Text size={big ? '1.6rem' : 'sm'} style={{ color: 'var(--cj-text-quiet)' }}>
        {label}
      </Text>
      <Text
        component="p"
        data-testid="figure-value"
        style={{ fontVariantNumeric: 'tabular-nums', fontSize: big ? '5.2rem' : '2.4rem', lineHeight: 1.05, fontWeight: 700, margin: 0 }}
      >
        {value}
      </Text>
      <Text size={big ? '1.6rem' : 'sm'} style={{ color: 'var(--cj-text-quiet)' }}>
        {unit}
      </Text>
    </Box>
  );
}

function Message({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Box component="main" p="lg" maw={520} mx="auto">
      <Title order={1} size="h2">
        {title}
      </Title>
      <Text mt="sm">{children}</Text>
    </Box>
  );
}

/** The public visitor board at /visit/:slug: no sign-in, phone-sized, a big-screen mode for the engine-house wall. */
export default function VisitPage() {
  const { slug = '' } = useParams();
  const [params, setParams] = useSearchParams();
  const wall = params.has('wall');
  const { data, error, isLoading } = useQuery(visitViewQuery(slug));
  const [figures, setFigures] = useState<VisitorFigures | null>(null);
  const [connected, setConnected] = useState(true);
  const [ended, setEnded] = useState<string | null>(null);
  const locale = typeof navigator !== 'undefined' ? navigator.language : undefined;
  const [units, setUnits] = useState<VisitorUnits>(() => storedUnits() ?? unitsForLocale(locale));
  useWakeLock(wall);
  useDarkWhile(wall);

  useEffect(() => {
    if (!data) return;
    const s = openVisitSocket(slug);
    s.on('visit:figures', (f) => setFigures(f));
    s.on('connect', () => setConnected(true));
    s.on('disconnect', () => setConnected(false));
    s.on('visit:ended', (e) => {
      setEnded(e.message);
      s.disconnect();
    });
    return () => {
      s.disconnect();
    };
  }, [data, slug]);

  useEffect(() => {
    document.title = data ? `${data.title} · visitor board` : 'Visitor board';
  }, [data]);

  const chooseUnits = (u: string) => {
    const next = u === 'imperial' ? 'imperial' : 'metric';
    setUnits(next);
    try {
      window.localStorage.setItem(UNITS_KEY, next);
    } catch {
      /* private browsing: the choice lasts for this visit */
    }
  };
  const setWall = (on: boolean) => {
    const next = new URLSearchParams(params);
    if (on) next.set('wall', '');
    else next.delete('wall');
    setParams(next, { replace: true });
  };

  if (isLoading) return <Loader m="xl" aria-label="Loading the visitor board" />;
  if (ended) return <Message title="The visitor board has ended">{ended} Ask at the engine house for the new code.</Message>;
  if (error || !data) {
    const missing = error instanceof HttpError && error.status === 404;
    return (
      <Message title={missing ? 'No visitor board here' : 'The board cannot be reached'}>
        {missing
          ? 'This visitor board has been switched off, or the address is not quite right. Scan the code in the engine house again.'
          : 'The engine house cannot be reached just now. This page will try again when you reload it.'}
      </Message>
    );
  }

  const view: VisitorBoardView = data;
  const f = figures ?? view.figures;
  const t = figureTexts(f, units, locale);
  const working = f.state === 'working';
  const big = wall;
  const page: CSSProperties = wall
    ? { height: '100vh', overflow: 'hidden', padding: '2.5vh 3vw', background: 'var(--cj-paper)', color: 'var(--cj-text)' }
    : { minHeight: '100vh', padding: 16, maxWidth: 560, margin: '0 auto', background: 'var(--cj-paper)', color: 'var(--cj-text)' };

  const header = (
    <Group justify="space-between" align="flex-start" wrap={big ? 'nowrap' : 'wrap'} gap="sm">
      <div>
        <Text size={big ? '1.6rem' : 'sm'} style={{ color: 'var(--cj-text-quiet)' }}>
          Live from the engine house
        </Text>
        <Title order={1} style={{ fontSize: big ? '3.6rem' : '1.8rem', lineHeight: 1.1 }}>
          {view.title}
        </Title>
        {view.title !== view.engineName && (
          <Text size={big ? '1.8rem' : 'md'} style={{ color: 'var(--cj-text-quiet)' }}>
            {view.engineName}
          </Text>
        )}
      </div>
      <Group gap="xs" wrap="wrap">
        <SegmentedControl
          size={big ? 'lg' : 'md'}
          aria-label="Units"
          value={units}
          onChange={chooseUnits}
          data={[
            { value: 'metric', label: 'Metric' },
            { value: 'imperial', label: 'Imperial' },
          ]}
        />
        <Button size={big ? 'lg' : 'md'} variant="default" onClick={() => setWall(!wall)}>
          {wall ? 'Phone view' : 'Big screen'}
        </Button>
      </Group>
    </Group>
  );

  const status = (
    <Text
      role="status"
      aria-live="polite"
      size={big ? '2.6rem' : 'xl'}
      fw={700}
      data-testid="engine-state"
      style={{ margin: big ? '1vh 0' : '8px 0' }}
    >
      {working ? 'The engine is working' : 'The engine is resting'}
      {!connected && (
        <Text component="span" size={big ? '1.6rem' : 'sm'} fw={400} style={{ color: 'var(--cj-text-quiet)', marginLeft: 12 }}>
          reconnecting…
        </Text>
      )}
    </Text>
  );

  const figuresGrid = (
    <Box style={{ display: 'grid', gridTemplateColumns: big ? 'repeat(2, 1fr)' : 'repeat(2, minmax(0, 1fr))', gap: big ? '2vh 3vw' : 16 }}>
      <Figure big={big} label="Speed" value={t.speed.value} unit={t.speed.unit} />
      <Figure big={big} label="Turns" value={t.revolutions.value} unit={t.revolutions.unit} />
      <Figure big={big} label="Steam pressure" value={t.pressure.value} unit={t.pressure.unit} />
      <Figure big={big} label="Power" value={t.power.value} unit={t.power.unit} />
    </Box>
  );

  const equivalents =
    f.horses !== null ? (
      <Text size={big ? '1.9rem' : 'md'} data-testid="equivalents" style={{ marginTop: big ? '2vh' : 12 }}>
        When last measured, the engine did the work of about <strong>{t.horses} horses</strong>, or{' '}
        <strong>{t.cars} small car engines</strong>.
      </Text>
    ) : null;

  const delayNote = (
    <Text size={big ? '1.3rem' : 'xs'} style={{ color: 'var(--cj-text-quiet)', marginTop: big ? '1vh' : 12 }}>
      Figures are about {f.delaySeconds} seconds behind the engine and smoothed.
    </Text>
  );

  if (wall)
    return (
      <Box component="main" style={page} data-testid="visit-wall">
        {header}
        <Group align="center" wrap="nowrap" gap="4vw" style={{ marginTop: '2vh' }}>
          <Box style={{ color: 'var(--cj-text)', flex: '0 0 auto' }}>
            <Flywheel rpm={working ? f.speedRpm : null} size={Math.round(Math.min(window.innerHeight * 0.55, 560))} />
          </Box>
          <Stack gap={0} style={{ flex: 1 }}>
            {status}
            {figuresGrid}
            {equivalents}
            {delayNote}
          </Stack>
        </Group>
      </Box>
    );

  return (
    <Box component="main" style={page} data-testid="visit-phone">
      {header}
      {status}
      <Box style={{ display: 'flex', justifyContent: 'center', color: 'var(--cj-text)' }}>
        <Flywheel rpm={working ? f.speedRpm : null} size={220} />
      </Box>
      {figuresGrid}
      {equivalents}
      {delayNote}
      {(view.story || view.photoPath) && (
        <Box component="section" aria-label="The engine's story" style={{ marginTop: 24 }}>
          <Title order={2} size="h3">
            The engine&apos;s story
          </Title>
          {view.photoPath && (
            <Image src={view.photoPath} alt={`${view.engineName}, photographed in the engine house`} radius="sm" mt="sm" />
          )}
          {view.story.split(/\n{2,}/).map((para, i) => (
            <Text key={i} mt="sm">
              {para}
            </Text>
          ))}
        </Box>
      )}
    </Box>
  );
}
