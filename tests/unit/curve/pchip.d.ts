// Types for pchip 1.0.2 (CommonJS, no bundled types): only the functions the tests call.
declare module 'pchip' {
  const pchip: {
    slopes_monotone(points: [number, number][]): number[];
    slopes_shape_preserving(points: [number, number][]): number[];
  };
  export default pchip;
}
