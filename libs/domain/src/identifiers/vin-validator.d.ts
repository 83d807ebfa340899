// The npm package ships no types; this is the one function the tests use.
declare module 'vin-validator' {
  export function validate(vin: string): boolean;
}
