import type { Role, SampleState } from '@ohmprint/contracts';

/** Which sample states each lab role acts on: the queue opens filtered to the signed-in user's. */
export const STATES_BY_ROLE: Partial<Record<Role, readonly SampleState[]>> = {
  'intake-technician': ['awaiting-arrival', 'received'],
  analyst: ['accepted', 'measuring', 'analysed', 'returned-for-rework'],
  reviewer: ['in-review'],
};

export function statesForRoles(roles: readonly Role[]): SampleState[] {
  const wanted = new Set(roles.flatMap((r) => STATES_BY_ROLE[r] ?? []));
  return [...wanted];
}
