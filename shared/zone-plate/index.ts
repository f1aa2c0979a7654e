/**
 * Fresnel zone-plate lens design for flat diffractive lenses patterned from a flake.
 * optics: formulas; design: a whole design with warnings and a storable summary; layout: the
 * radii CSV and ring preview; validation/limits: the input rules shared with the zod schema.
 */
export * from './design';
export * from './format';
export * from './layout';
export * from './limits';
export * from './optics';
export * from './validation';
export * from './warnings';
