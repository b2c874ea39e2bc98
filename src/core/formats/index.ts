export { parseTsplib, type TsplibInstance } from "./parseTsplib.js";
export { tsplibEdge } from "./tsplibEdge.js";
export { tsplibTourLength } from "./tsplibTourLength.js";
export { tsplibToProblem } from "./tsplibToProblem.js";
export { parseSolomon, type SolomonInstance, type SolomonCustomer } from "./parseSolomon.js";
export { solomonToProblem, solomonDistance } from "./solomonToProblem.js";
export { solomonRoutesDistance } from "./solomonRoutesDistance.js";
export { detectFormat } from "./detectFormat.js";
export { tsplibDistance, tsplibGeoDegrees, tsplibGeoRadians, type TsplibCoordType, type TsplibPoint } from "../geo/tsplibDistance.js";
