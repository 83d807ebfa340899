// The npm package ships no types; these are the functions the tests use as an independent check.
declare module 'jstat' {
  const jStat: {
    normal: {
      inv(p: number, mean: number, sd: number): number;
      cdf(x: number, mean: number, sd: number): number;
    };
  };
  export default jStat;
}
