// Public API of the spectral engine. Each area adds its own export line here.
export type { Spectrum } from './spectrum';
export { ENGINE_VERSION } from './version';
