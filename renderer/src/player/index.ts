/** The footage player: one import for every screen. */
export type { DisplayedFrame, PlayerControl } from './contract.ts';
export { FootagePlayer, type FootagePlayerProps } from './FootagePlayer.tsx';
export { createVideoPlayer, type FootagePlayerControl, type ShownFrame } from './video-player.ts';
export { useFootageSource, newestFit, trackingClock, type FootageSourceState } from './use-footage-source.ts';
export * from './clocks.ts';
export * from './frame-table.ts';
export { playerActionOf, PLAYER_KEYS, JUMPS } from './player-keys.ts';
