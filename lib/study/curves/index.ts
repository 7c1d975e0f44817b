export { gainCurvePoints, type GainCurve, type SpeedPoint } from "./gainCurve";
export { stickResponsePoints, tiltResponsePoints, type RateResponse } from "./stickResponse";
export { deviceTurnSamples, turnDisplacement, type TurnDisplacement } from "./turnDisplacement";
