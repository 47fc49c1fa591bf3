// psychrolib ships no types. Only the SI members Dewline calls are declared; add more as needed.
declare module "psychrolib" {
  interface PsychroLib {
    SI: number;
    IP: number;
    SetUnitSystem(unit: number): void;
    GetSatVapPres(tDryBulb: number): number;
    GetVapPresFromRelHum(tDryBulb: number, relHum: number): number;
    GetRelHumFromVapPres(tDryBulb: number, vapPres: number): number;
    GetTDewPointFromRelHum(tDryBulb: number, relHum: number): number;
    GetTDewPointFromVapPres(tDryBulb: number, vapPres: number): number;
    GetVapPresFromTDewPoint(tDewPoint: number): number;
    GetHumRatioFromVapPres(vapPres: number, pressure: number): number;
    GetHumRatioFromRelHum(tDryBulb: number, relHum: number, pressure: number): number;
    GetMoistAirDensity(tDryBulb: number, humRatio: number, pressure: number): number;
  }
  const psychrolib: PsychroLib;
  export default psychrolib;
}
