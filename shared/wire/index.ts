export * from './awg';
export * from './copper';
export * from './voltageDrop';
export * from './colors';
export * from './cavities';
export * from './units';
