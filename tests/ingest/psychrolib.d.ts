// Types for the parts of the npm `psychrolib` package (ASHRAE psychrometric functions) that the
// tests use as an outside reference; the package ships none.
declare module 'psychrolib' {
  interface Psychrolib {
    SI: number;
    IP: number;
    SetUnitSystem(unitSystem: number): void;
    GetSatVapPres(tDryBulbC: number): number;
    GetTDewPointFromRelHum(tDryBulbC: number, relHum: number): number;
    GetTDewPointFromVapPres(tDryBulbC: number, vapPresPa: number): number;
  }
  const psychrolib: Psychrolib;
  export = psychrolib;
}
