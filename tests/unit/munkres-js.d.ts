// munkres-js ships no types: the Hungarian method (Munkres 1957) on a cost matrix, returning
// the chosen [row, column] pairs. Rectangular matrices are padded.
declare module "munkres-js" {
  function computeMunkres(costMatrix: number[][]): Array<[number, number]>;
  export default computeMunkres;
}
