// Public surface of the geometry library: plain data in, plain data out.
// The core (parameters, plate, units, presets) and the exporters.
export * from './core'
export * from './export'
export * from './nest'
