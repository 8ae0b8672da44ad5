// How Ringdown writes numbers for people: one function per kind of value, one precision rule each.
export { formatCount, formatNumber, formatPercent, formatSigned, MINUS, MISSING, roundSignificant } from './number';
export { DB_DECIMALS, formatDb, formatMs, formatMsRange, formatSeconds, formatWait, SECONDS_DECIMALS } from './quantities';
export { formatBand, formatHz, formatHzAxis, formatHzRange, formatSampleRate } from './frequency';
export { capitalise, formatList, formatRange } from './text';
export { formatArea, formatCoefficient, formatRoomLength, formatRoomSize, formatRoomSizeBare, formatVolume, roomLengthInput, roomLengthUnit, type RoomSize, type UnitSystem } from './room';
export { formatDate, formatDateTime } from './date';
