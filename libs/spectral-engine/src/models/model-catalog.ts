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
