import type { EntityManager } from 'typeorm';
import {
  DEFAULT_INTAKE_LIMITS,
  DEFAULT_INTAKE_LIMITS_SOURCE,
  LAB_INTAKE_LIMITS_SOURCE,
  MATRICES,
  type ContainerCondition,
  type IntakeLimit,
  type IntakeLimits,
  type IntakeWarning,
  type Matrix,
} from '@ohmprint/contracts';

const DAY_MS = 86_400_000;

const CONDITION_WORDS: Readonly<Record<ContainerCondition, string>> = {
  intact: 'intact',
  damaged: 'damaged',
  leaking: 'leaking',
  unlabelled: 'without a label',
};

/** The lab's limits for every matrix: its own where it set them, Ohmprint's defaults otherwise. */
export function limitsFrom(stored: IntakeLimit[] | null): IntakeLimits {
  const own = new Map((stored ?? []).map((l) => [l.matrix, l]));
  return {
    limits: MATRICES.map((matrix) => own.get(matrix) ?? { matrix, ...DEFAULT_INTAKE_LIMITS[matrix] }),
    source: stored?.length ? LAB_INTAKE_LIMITS_SOURCE : DEFAULT_INTAKE_LIMITS_SOURCE,
  };
}

export async function labIntakeLimits(manager: EntityManager, labId: string): Promise<IntakeLimits> {
  const [row]: { intake_limits: IntakeLimit[] | null }[] = await manager.query('SELECT intake_limits FROM lab WHERE id = $1', [labId]);
  return limitsFrom(row?.intake_limits ?? null);
}

export interface ArrivalFacts {
  sealIntact: boolean;
  containerCondition: ContainerCondition;
  temperatureC: number;
  arrivedAt: Date;
  /** ISO date the client obtained the sample. */
  obtainedOn: string;
  matrix: Matrix;
}

/** Everything about an arrival that intake should look at twice, in words a technician reads. */
export function intakeWarnings(facts: ArrivalFacts, limits: IntakeLimits): IntakeWarning[] {
  const limit = limits.limits.find((l) => l.matrix === facts.matrix) ?? { matrix: facts.matrix, ...DEFAULT_INTAKE_LIMITS[facts.matrix] };
  const warnings: IntakeWarning[] = [];
  if (!facts.sealIntact) warnings.push({ field: 'sealIntact', message: 'The seal was broken on arrival.' });
  if (facts.containerCondition !== 'intact') {
    warnings.push({ field: 'containerCondition', message: `The container arrived ${CONDITION_WORDS[facts.containerCondition]}.` });
  }
  if (facts.temperatureC < limit.minArrivalC || facts.temperatureC > limit.maxArrivalC) {
    warnings.push({
      field: 'temperatureC',
      message: `It arrived at ${facts.temperatureC} °C, outside ${limit.minArrivalC}–${limit.maxArrivalC} °C for ${facts.matrix}.`,
    });
  }
  const ageDays = Math.floor((facts.arrivedAt.getTime() - Date.parse(`${facts.obtainedOn}T00:00:00Z`)) / DAY_MS);
  if (ageDays > limit.maxAgeDays) {
    warnings.push({ field: 'obtainedOn', message: `It was obtained ${ageDays} days before arrival; ${facts.matrix} is tested within ${limit.maxAgeDays} days.` });
  }
  return warnings;
}
