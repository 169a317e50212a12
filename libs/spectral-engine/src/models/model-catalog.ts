import { BUILTIN_MODELS } from './builtin-models';
import type { ModelDescription } from './model-types';

/**
 * The built-in models as the portals list them: name, label, formula and parameters with units
 * and bounds (null = unbounded). Plain data, safe to send as JSON.
 */
export const MODEL_CATALOG: readonly ModelDescription[] = [...BUILTIN_MODELS.values()].map((m) => ({
  name: m.name,
  label: m.label,
  formula: m.formula,
  parameters: m.parameters.map((p) => ({ ...p })),
}));

/** What a reader calls a model ("Cole–Cole relaxation"); a lab-defined model keeps its own name. */
export function modelLabel(name: string): string {
  return BUILTIN_MODELS.get(name)?.label ?? name;
}
