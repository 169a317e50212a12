import type { EntityManager } from 'typeorm';
import { canMoveSample, sampleStateInWords, type SampleState } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { Sample } from './sample.entity';

/**
 * The lab's sample, locked for the rest of the transaction when `lock` is set so two people
 * cannot move it at once. Another lab's sample answers 404, as if it did not exist.
 */
export async function findLabSample(manager: EntityManager, labId: string, sampleId: string, lock = false): Promise<Sample> {
  const sample = await manager.findOne(Sample, {
    where: { id: sampleId, labId },
    ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}),
  });
  if (!sample) throw ApiError.notFound('Sample');
  return sample;
}

/** Moves a sample along its state machine, or refuses with a 409 that says what is possible. */
export async function moveSample(manager: EntityManager, sample: Sample, to: SampleState, extra: Partial<Sample> = {}): Promise<Sample> {
  if (!canMoveSample(sample.state, to)) {
    throw ApiError.conflict(`Sample ${sample.code} is ${sampleStateInWords(sample.state)}; it cannot become ${sampleStateInWords(to)} from there.`);
  }
  const changes = { ...extra, state: to, stateChangedAt: new Date() };
  await manager.update(Sample, { id: sample.id, labId: sample.labId }, changes);
  return Object.assign(sample, changes);
}

/** Refuses unless the sample is in one of `states`. */
export function requireSampleState(sample: Sample, states: readonly SampleState[], doing: string): void {
  if (!states.includes(sample.state)) {
    throw ApiError.conflict(`Sample ${sample.code} is ${sampleStateInWords(sample.state)}; ${doing} needs it to be ${states.map(sampleStateInWords).join(' or ')}.`);
  }
}
