export { fitPumpCurve, CURVE_SAMPLES, type PumpCurveFit } from './fit';
