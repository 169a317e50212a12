// Lab workflow contracts: orders, samples, intake, custody, measurements, libraries, analyses, review.
export * from './refs';
export * from './sample-state';
export * from './products';
export * from './orders';
export * from './intake';
export * from './custody';
export * from './measurements';
export * from './instrument-keys';
export * from './libraries';
export * from './methods';
export * from './library-build';
export * from './reference-spectra';
export * from './analyses';
export * from './reviews';
export * from './chemistry';
export * from './intake-limits';
