// Minimal types for the psychrolib package (ASHRAE Handbook Fundamentals 2017 ch. 1), used in
// tests as an independent implementation. Only the functions the tests call are declared.
declare module 'psychrolib' {
  interface Psychrolib {
    SI: number
    IP: number
    SetUnitSystem(system: number): void
    GetSatVapPres(tDryBulbC: number): number
    GetDryAirDensity(tDryBulbC: number, pressurePa: number): number
    GetVapPresFromRelHum(tDryBulbC: number, relHum: number): number
    GetHumRatioFromRelHum(tDryBulbC: number, relHum: number, pressurePa: number): number
    GetMoistAirDensity(tDryBulbC: number, humRatio: number, pressurePa: number): number
    GetMoistAirVolume(tDryBulbC: number, humRatio: number, pressurePa: number): number
    GetTDewPointFromRelHum(tDryBulbC: number, relHum: number): number
    GetTDewPointFromHumRatio(tDryBulbC: number, humRatio: number, pressurePa: number): number
    GetTDewPointFromVapPres(tDryBulbC: number, vapPresPa: number): number
    GetVapPresFromHumRatio(humRatio: number, pressurePa: number): number
    GetStandardAtmPressure(altitudeM: number): number
    GetStandardAtmTemperature(altitudeM: number): number
  }
  const psychrolib: Psychrolib
  export default psychrolib
}
