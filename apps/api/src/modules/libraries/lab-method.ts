import type { EntityManager } from 'typeorm';
import type { MethodSettings } from '@ohmprint/contracts';
import { DEFAULT_METHOD } from './default-method';
import { LabMethodSettings } from './method-settings.entity';

/** The lab's current method, or the default until its admin saves one. */
export async function labMethod(manager: EntityManager, labId: string): Promise<MethodSettings> {
  const row = await manager.findOne(LabMethodSettings, { where: { labId } });
  return row?.settings ?? DEFAULT_METHOD;
}
