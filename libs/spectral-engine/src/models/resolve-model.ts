import { BUILTIN_MODELS, type ModelName } from './builtin-models';
import { defineExpressionModel } from './expression-model';
import { ModelDefinitionError } from './model-definition-error';
import type { ImpedanceModel } from './model-types';

/** A model by built-in name, a lab-defined expression in ω and j, or a model already defined. */
export type ModelReference = ModelName | (string & {}) | ImpedanceModel;

/**
 * Turns a model reference into a model. A string that is not a built-in name is read as an
 * expression; if that fails too, the error says both.
 */
export function resolveModel(model: ModelReference): ImpedanceModel {
  if (typeof model !== 'string') return model;
  const builtin = BUILTIN_MODELS.get(model);
  if (builtin) return builtin;
  try {
    return defineExpressionModel(model);
  } catch (error) {
    if (!(error instanceof ModelDefinitionError)) throw error;
    throw new ModelDefinitionError(
      `'${model}' is not a built-in model (${[...BUILTIN_MODELS.keys()].join(', ')}) and not a usable expression: ${error.message}`,
      error.token,
      error.position,
    );
  }
}
