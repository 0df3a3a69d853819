export { colors, curveColors, palette } from './colors';
export { layout, radius, space, stroke } from './spacing';
export { fontFaces, fontFamily, typeScale, type TypeVariant } from './typography';
