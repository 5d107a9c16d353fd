import type { BarDto, LotDetail, PassCalculationDto, ScheduleDetail } from '@crankjournal/shared-types';

/** A calculation shaped as the server sends it (figures invented for the UI tests, not checked here). */
export function calc(over: Partial<PassCalculationDto> = {}): PassCalculationDto {
  return {
    entryAreaMm2: 5806.44,
    exitAreaMm2: 4960,
    draftMm: 14.2,
    reduction: 0.186,
    areaReduction: 0.146,
    elongation: 1.171,
    trueStrain: 0.206,
    contactLengthMm: 53.7,
    meanWidthMm: 78.1,
    rollSpeedRpm: 75,
    rollSurfaceSpeedMPerS: 1.6,
    meanStrainRatePerS: 6.1,
    flowStress: {
      model: 'misaka',
      citation: 'Misaka & Yoshimoto (1967), test citation.',
      meanFlowStressMPa: 74,
      extrapolated: true,
      outOfRange: ['strain rate 6.10 /s outside 30–200 /s'],
    },
    frictionFactor: 1.2,
    frictionCoefficient: 0.3,
    maxBiteDraftMm: 18.3,
    bites: true,
    forceModel: 'simple',
    geometryFactor: null,
    models: {
      strain: 'ln(entry height / exit height), flat pass',
      flowStress: 'Misaka & Yoshimoto hot flow stress',
      force: 'L·w·σ̄ × friction factor 1.2, simple slab estimate',
      bite: 'Δh ≤ μ²·R with μ = 0.3',
    },
    forceKn: 372,
    forceLbf: 83600,
    torquePerRollKnM: 10,
    torquePerRollLbfFt: 7375,
    powerRollPairKw: 157,
    powerRollPairHp: 210,
    standMaxForceKn: 900,
    standForceUtilisation: 0.41,
    exceedsStandForce: false,
    flywheel: {
      inertiaKgM2: 647600,
      storedEnergyKj: 19974,
      startSpeedRpm: 75,
      endSpeedRpm: 74.8,
      speedDropRpm: 0.2,
      minAllowedSpeedRpm: 67.5,
      belowMinSpeed: false,
      stalled: false,
      barExitLengthM: 2.1,
      passDurationS: 1.3,
      passEnergyKj: 205,
      energyFromFlywheelKj: 205,
      indicatedHp: 650,
      indicatedHpSource: 'site setting',
      startSpeedSource: 'rated speed',
      surplusPowerHp: 512,
      recoveryTimeS: 0.54,
    },
    warnings: [],
    ...over,
  };
}

export function overloaded(): PassCalculationDto {
  const c = calc({ forceKn: 2347, standForceUtilisation: 2.6, exceedsStandForce: true });
  return {
    ...c,
    flywheel: { ...c.flywheel!, endSpeedRpm: 61.9, speedDropRpm: 13.1, belowMinSpeed: true },
    warnings: [
      {
        code: 'stand_force',
        message: "Roll force 2347 kN is over the stand's maximum of 900 kN (261 %). Take a lighter draft or roll hotter.",
      },
      {
        code: 'speed_drop',
        message: 'Speed would fall to 61.9 rpm, below 67.5 rpm (90 % of rated). Take a lighter draft or wait for full speed.',
      },
    ],
  };
}

export const rect = (heightMm: number, widthMm: number) => ({ shape: 'rectangle' as const, heightMm, widthMm });

export function bar(over: Partial<BarDto> = {}): BarDto {
  return {
    id: 'bar-1',
    runId: 'run-1',
    barCode: 'B-01',
    scheduleId: 'sch-1',
    scheduleName: 'Square test',
    lotId: null,
    lotReference: null,
    stock: rect(76.2, 76.2),
    stockLengthMm: 1800,
    weightKg: null,
    scrapped: false,
    scrapReason: null,
    notes: '',
    passes: [],
    createdAt: '2026-12-01T10:00:00Z',
    ...over,
  };
}

export function schedule(): ScheduleDetail {
  return {
    id: 'sch-1',
    millId: 'mill-1',
    millName: 'Test mill',
    name: 'Square test',
    isTemplate: false,
    archived: false,
    productShape: 'square',
    productHeightMm: 50.8,
    productWidthMm: 50.8,
    steelGrade: 'Mild steel',
    carbonPct: 0.2,
    stock: rect(76.2, 76.2),
    stockLengthMm: 1800,
    passCount: 2,
    flaggedPasses: 0,
    templateId: null,
    templateName: null,
    lotId: null,
    lotReference: null,
    updatedAt: '2026-12-01T10:00:00Z',
    notes: '',
    passes: [
      {
        id: 'p1',
        seq: 1,
        standPosition: 1,
        standName: 'Stand 1',
        entry: rect(76.2, 76.2),
        exit: rect(62, 80),
        expectedTemperatureC: 1150,
        notes: '',
        calc: calc(),
        calcError: null,
      },
      {
        id: 'p2',
        seq: 2,
        standPosition: 2,
        standName: 'Stand 2',
        entry: rect(80, 62),
        exit: rect(60, 66),
        expectedTemperatureC: 1110,
        notes: '',
        calc: calc(),
        calcError: null,
      },
    ],
    totalElongation: 2.25,
    finalLengthM: 4,
    assumptions: [],
    createdByName: 'Test',
    createdAt: '2026-12-01T10:00:00Z',
  };
}

export function lot(over: Partial<LotDetail> = {}): LotDetail {
  return {
    id: 'lot-1',
    reference: 'LOT-2026-009',
    customerName: 'Test customer',
    productShape: 'square',
    productHeightMm: 50.8,
    productWidthMm: 50.8,
    steelGrade: 'Mild steel',
    quantityTonnes: 2,
    dueDate: '2027-01-31',
    status: 'quoted',
    producedTonnes: 0,
    scrappedTonnes: 0,
    latestQuoteTotal: 1000,
    currency: 'GBP',
    updatedAt: '2026-12-01T10:00:00Z',
    customerEmail: 'buyer@example.test',
    customerContact: '',
    carbonPct: 0.2,
    notes: '',
    millId: 'mill-1',
    nextStatus: 'accepted',
    history: [],
    runs: [],
    bars: [],
    barTonnes: { produced: 1.9, scrapped: 0.1 },
    quotes: [],
    createdAt: '2026-12-01T10:00:00Z',
    ...over,
  };
}

export const json = (body: unknown, status = 200) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
