/** Footage ↔ tracking: the footage clock fit from paired anchors, and proposed pairings. */
export { fitFootageClock, pairResidual, isMarkedPair, type FootagePair, type FootageFitOptions, type FootageClockFit, type KindLag } from './fit.ts';
export { proposePairings, clockText, kindWord, type Proposal, type ProposeOptions, type FootageAnchorInput, type TrackingAnchorInput } from './propose.ts';
export { WHISTLE_LAGS, lagFor, referenceTime, type WhistleLag, type TrackingMoment } from './lag-model.ts';
