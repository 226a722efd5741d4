// Alignment engine: kinematics, anchors, clock fits, coarse alignment, refinement, sync.
export { savgolWeights, savgolSeries, type SavgolOptions } from './kinematics/savgol.ts';
export { objectMotion, type Motion, type MotionOptions } from './kinematics/motion.ts';
export { restartKindAt, outOfField, LAW1 } from './anchors/geometry.ts';
export { detectRestarts, type RestartAnchor, type RestartOptions } from './anchors/restarts.ts';
export { eventAnchors } from './anchors/events.ts';
export { alignRestarts, alignAt, type AlignOptions, type CoarseMatch, type AnchorPair } from './align/coarse.ts';
export { huberFit, theilSen, median, mad, type LineFit } from './fit/robust.ts';
export { fitClock, fitClocks, findBreaks, mapTime, segmentAt, type ClockPair, type ClockFitOptions } from './fit/clock.ts';
export { footageToTracking, trackingToFootage, type TrackingMoment } from './fit/footage-map.ts';
export { ballTouches, type BallTouch } from './refine/kicks.ts';
export { chooseMonotone, type EventOptions, type Option } from './refine/choose.ts';
export { buildScenes, refineEvents, type PeriodScene } from './refine/refine.ts';
export { syncMatch, type SyncOptions, type SyncResult } from './sync.ts';
export {
  applyHomography,
  homogeneousW,
  invertHomography,
  composeHomography,
  reprojectionErrors,
  solveHomography,
  checkRegistrationInput,
  GeometryError,
  COLLINEAR_TOLERANCE,
  type Vec2,
  type Homography,
  type GeometryProblem,
} from './geometry/homography.ts';
export { fitHomography, type HomographyFit, type RansacOptions } from './geometry/ransac.ts';
export { refineHomography } from './geometry/refine.ts';
export { seededRandom } from './geometry/prng.ts';
export { pitchModel, LAW1_MARKINGS, type PitchModel, type PitchMarking, type PitchLandmark, type MarkingKind } from './geometry/pitch-model.ts';
export { projectPolyline } from './geometry/projection.ts';
export { homographyAt, interpolateHomography, type RegistrationKey, type FrameSize } from './geometry/keyframes.ts';
export { jenksGroups } from './geometry/jenks.ts';
export { offsideLine, backLine, teamLines, playerDistance, guessKeepers, attackSign, type PlayerSpot, type OffsideLine, type TeamLine, type HomeAttacks } from './geometry/lines.ts';
export { convexHull, polygonArea, teamShape, type TeamShape } from './geometry/shape.ts';
export { pitchSpace, type SpaceCell, type TeamSpace } from './geometry/space.ts';
export { frameGeometry, type FrameGeometry, type TeamFrameGeometry } from './geometry/frame-geometry.ts';
