import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Checkbox, Group, NumberInput, Paper, Select, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import type { RollingPassRequest, RollingPassResponse } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { Caution } from '../../../components/Caution/Caution';
import { PageHeader } from '../../../components/PageHeader';
import { calculateRollingPass, millsQuery } from '../api/mill.api';
import { fmt, pct, seconds } from '../model/format';
import { MILL_CAUTION } from '../model/caution';
import { SectionInput, sectionOf, type SectionDraft } from '../components/SectionInput';
import { ExtrapolatedBadge, PassWarnings } from '../components/PassWarnings';
import { PassWorking } from '../components/PassCalcTable';

type Num = number | '';
export interface RollingPassForm {
  rollDiameterMm: Num;
  entry: SectionDraft;
  exit: SectionDraft;
  temperatureC: Num;
  carbonPct: Num;
  rollSpeedRpm: Num;
  standMaxForceKn: Num;
  frictionFactor: Num;
  /** roll–stock friction coefficient for the bite check (hot rolling: 0.3 unless changed) */
  frictionCoefficient: Num;
  flywheel: boolean;
  flywheelMassLb: Num;
  flywheelRadiusOfGyrationFt: Num;
  engineSpeedRpm: Num;
  ratedSpeedRpm: Num;
  barExitLengthM: Num;
  indicatedHp: Num;
  minSpeedFraction: Num;
  mechanicalEfficiency: Num;
  baseLoadHp: Num;
}

/** Example: the first box pass of a 3 in square billet on a 16 in mill behind a 75 rpm engine (invented figures). */
export const EXAMPLE: RollingPassForm = {
  rollDiameterMm: 406.4,
  entry: { shape: 'rectangle', heightMm: 76.2, widthMm: 76.2 },
  exit: { shape: 'rectangle', heightMm: 62, widthMm: 80 },
  temperatureC: 1150,
  carbonPct: 0.2,
  rollSpeedRpm: 75,
  standMaxForceKn: 900,
  frictionFactor: 1.2,
  frictionCoefficient: 0.3,
  flywheel: true,
  flywheelMassLb: 156800,
  flywheelRadiusOfGyrationFt: 9.9,
  engineSpeedRpm: 75,
  ratedSpeedRpm: 75,
  barExitLengthM: 2.1,
  indicatedHp: 650,
  minSpeedFraction: 0.9,
  mechanicalEfficiency: 0.88,
  baseLoadHp: 60,
};

const n = (v: Num) => (v === '' ? undefined : Number(v));

/** The API body: figures as typed (missing ones left out, so the server names them). */
export function toRollingPassRequest(f: RollingPassForm): RollingPassRequest {
  const entry = sectionOf(f.entry);
  const exit = sectionOf(f.exit);
  const body: RollingPassRequest = {
    rollDiameterMm: n(f.rollDiameterMm) as number,
    entryThicknessMm: entry?.heightMm as number,
    entryWidthMm: entry?.widthMm as number,
    entryShape: f.entry.shape,
    exitThicknessMm: exit?.heightMm as number,
    exitWidthMm: exit?.widthMm,
    exitShape: f.exit.shape,
    temperatureC: n(f.temperatureC) as number,
    carbonPct: n(f.carbonPct) as number,
    rollSpeedRpm: n(f.rollSpeedRpm) as number,
    standMaxForceKn: n(f.standMaxForceKn) as number,
    frictionFactor: n(f.frictionFactor),
    frictionCoefficient: n(f.frictionCoefficient),
  };
  if (f.flywheel) {
    Object.assign(body, {
      flywheelMassLb: n(f.flywheelMassLb),
      flywheelRadiusOfGyrationFt: n(f.flywheelRadiusOfGyrationFt),
      engineSpeedRpm: n(f.engineSpeedRpm),
      ratedSpeedRpm: n(f.ratedSpeedRpm),
      barExitLengthM: n(f.barExitLengthM),
      indicatedHp: n(f.indicatedHp),
      minSpeedFraction: n(f.minSpeedFraction),
      mechanicalEfficiency: n(f.mechanicalEfficiency),
      baseLoadHp: n(f.baseLoadHp),
    });
  }
  return JSON.parse(JSON.stringify(body)) as RollingPassRequest;
}

function Tile({ label, children, danger }: { label: string; children: ReactNode; danger?: boolean }) {
  return (
    <Paper withBorder p="md" radius="md" style={danger ? { borderColor: 'var(--mantine-color-signal-6)', borderWidth: 2 } : undefined}>
      <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
        {label}
      </Text>
      <Text className="cj-num" fz={26} fw={600} c={danger ? 'signal.7' : undefined}>
        {children}
      </Text>
    </Paper>
  );
}

/** /calculators/rolling-pass: the stateless pass calculator over POST /api/calculations/rolling-pass. */
export default function RollingPassCalculatorPage() {
  const [form, setForm] = useState<RollingPassForm>(EXAMPLE);
  const [result, setResult] = useState<RollingPassResponse | null>(null);
  const [error, setError] = useState<string | null>(null);
  const mills = useQuery(millsQuery());
  const request = useMemo(() => toRollingPassRequest(form), [form]);
  const key = JSON.stringify(request);
  useEffect(() => {
    let live = true;
    const t = setTimeout(() => {
      calculateRollingPass(request)
        .then((r) => {
          if (!live) return;
          setResult(r);
          setError(null);
        })
        .catch((e) => {
          if (!live) return;
          setResult(null);
          setError(errorText(e));
        });
    }, 350);
    return () => {
      live = false;
      clearTimeout(t);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- key is the JSON of request: ask only when the figures change
  }, [key]);

  const stands = (mills.data ?? []).flatMap((m) => m.stands.map((s) => ({ mill: m, stand: s })));
  const fillFrom = (standId: string | null) => {
    const x = stands.find((s) => s.stand.id === standId);
    if (!x) return;
    const { mill, stand } = x;
    setForm((f) => ({
      ...f,
      rollDiameterMm: stand.rollDiameterMm,
      standMaxForceKn: stand.maxSeparatingForceKn,
      rollSpeedRpm: +(mill.engine.ratedSpeedRpm * stand.rollSpeedRatio).toFixed(3),
      frictionFactor: mill.settings.frictionFactor,
      flywheelMassLb: mill.engine.flywheelMassLb ?? f.flywheelMassLb,
      flywheelRadiusOfGyrationFt: mill.engine.flywheelRadiusOfGyrationFt ?? f.flywheelRadiusOfGyrationFt,
      engineSpeedRpm: mill.engine.ratedSpeedRpm,
      ratedSpeedRpm: mill.engine.ratedSpeedRpm,
      indicatedHp: mill.settings.defaultIndicatedHp,
      minSpeedFraction: mill.settings.minSpeedFraction,
      mechanicalEfficiency: mill.settings.mechanicalEfficiency,
      baseLoadHp: mill.settings.baseLoadHp,
    }));
  };
  const num = (label: string, k: keyof RollingPassForm, w = 180) => (
    <NumberInput
      label={label}
      w={w}
      hideControls
      inputMode="decimal"
      value={form[k] as Num}
      onChange={(v) => setForm((f) => ({ ...f, [k]: v === '' ? '' : Number(v) }))}
    />
  );
  const f = result?.flywheel;
  return (
    <>
      <PageHeader
        title="Rolling pass"
        subtitle={
          'Reduction, elongation, contact length L = √(R·Δh), mean flow stress of hot carbon steel (Misaka & ' +
          'Yoshimoto), roll force F = L·w·Y, torque and power; and how far the flywheel’s speed falls over the ' +
          'pass.'
        }
        action={
          <Button component={Link} to="/calculators" variant="default">
            All calculators
          </Button>
        }
      />
      <Stack gap="md">
        <Caution title="Hot steel and heavy rolls">{result?.caution ?? MILL_CAUTION}</Caution>
        <Paper withBorder p="md" radius="md">
          <Group align="flex-end" gap="md" wrap="wrap">
            <Select
              label="Fill from a stand of the mill"
              w={320}
              placeholder="Choose a stand"
              data={stands.map((s) => ({ value: s.stand.id, label: `${s.mill.name}: ${s.stand.position}. ${s.stand.name}` }))}
              onChange={fillFrom}
            />
            <Button variant="default" onClick={() => setForm(EXAMPLE)}>
              Example figures
            </Button>
          </Group>
        </Paper>
        <Paper withBorder p="md" radius="md">
          <Title order={2} fz="lg" mb="sm">
            Stand and pass
          </Title>
          <Group align="flex-end" gap="md" wrap="wrap" mb="sm">
            {num('Roll diameter, mm', 'rollDiameterMm')}
            {num('Roll speed, rpm', 'rollSpeedRpm')}
            {num('Stand maximum force, kN', 'standMaxForceKn', 200)}
            {num('Friction allowance (×)', 'frictionFactor')}
            {num('Friction coefficient μ (bite)', 'frictionCoefficient', 200)}
            {num('Temperature, °C', 'temperatureC')}
            {num('Carbon, %', 'carbonPct')}
          </Group>
          <SectionInput label="Entry" value={form.entry} onChange={(v) => setForm((x) => ({ ...x, entry: v }))} />
          <SectionInput label="Exit" value={form.exit} onChange={(v) => setForm((x) => ({ ...x, exit: v }))} />
        </Paper>
        <Paper withBorder p="md" radius="md">
          <Checkbox
            label="Check the flywheel’s share"
            checked={form.flywheel}
            onChange={(e) => setForm((x) => ({ ...x, flywheel: e.currentTarget.checked }))}
            mb="sm"
          />
          {form.flywheel && (
            <Group align="flex-end" gap="md" wrap="wrap">
              {num('Flywheel mass, lb', 'flywheelMassLb')}
              {num('Radius of gyration, ft', 'flywheelRadiusOfGyrationFt')}
              {num('Engine speed at entry, rpm', 'engineSpeedRpm', 200)}
              {num('Rated speed, rpm', 'ratedSpeedRpm')}
              {num('Bar out of the rolls, m', 'barExitLengthM')}
              {num('Indicated power, hp', 'indicatedHp')}
              {num('Warn below (fraction of rated)', 'minSpeedFraction', 220)}
              {num('Mechanical efficiency', 'mechanicalEfficiency')}
              {num('Base load, hp', 'baseLoadHp')}
            </Group>
          )}
        </Paper>
        {error && (
          <Alert color="signal" role="alert" title="Cannot work this out">
            {error}
          </Alert>
        )}
        {result && (
          <Stack gap="md" data-testid="rolling-pass-result">
            <SimpleGrid cols={{ base: 2, md: 3, lg: 6 }} spacing="md">
              <Tile label="Roll force" danger={result.exceedsStandForce}>
                {fmt(result.forceKn, 0)} kN
              </Tile>
              <Tile label="Of the stand’s maximum" danger={result.exceedsStandForce}>
                {pct(result.standForceUtilisation, 0)}
              </Tile>
              <Tile label="Power, roll pair">{fmt(result.powerRollPairKw, 0)} kW</Tile>
              <Tile label="Mean flow stress">
                {fmt(result.flowStress.meanFlowStressMPa, 0)} MPa <ExtrapolatedBadge flowStress={result.flowStress} />
              </Tile>
              {f && (
                <Tile label="Speed after the pass" danger={f.belowMinSpeed}>
                  {fmt(f.endSpeedRpm, 1)} rpm
                </Tile>
              )}
              {f && <Tile label="Back to speed in">{f.recoveryTimeS === null ? 'never' : seconds(f.recoveryTimeS)}</Tile>}
            </SimpleGrid>
            <PassWarnings warnings={result.warnings} />
            <Paper withBorder p="md" radius="md" data-testid="rolling-pass-models">
              <Title order={3} fz="md" mb={4}>
                Models used
              </Title>
              <Text fz="sm">Strain: {result.models.strain}</Text>
              <Text fz="sm">Flow stress: {result.models.flowStress}</Text>
              <Text fz="sm">Roll force: {result.models.force}</Text>
              <Text fz="sm">
                Bite: {result.models.bite} — largest draft {fmt(result.maxBiteDraftMm, 1)} mm
              </Text>
            </Paper>
            <Paper withBorder p="md" radius="md">
              <PassWorking calc={result} />
            </Paper>
          </Stack>
        )}
      </Stack>
    </>
  );
}
