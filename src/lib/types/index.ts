// Shapes the server hands to pages and the browser: importable on both sides.
export type { CaptureView } from './captures';
export type { ProjectRow } from './projects';
export type { RoomRow } from './rooms';
export type { SessionRow } from './sessions';
export type { Point, PositionRow } from './positions';
