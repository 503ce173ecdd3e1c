// Where a logger record has holes: steps longer than one and a half times its usual step (the median),
// e.g. the hour that vanishes when a logger on daylight-saving time is read as standard time. The usual step
// is the storm finding's own (core/hydrograph/bridging-limit.ts): one measure of a record's step.
import { usualStep_ms } from '../hydrograph/bridging-limit';

/** A hole in a record: the lines either side and the times (UTC ms) of the values either side. */
export interface LoggerGap {
  afterLine: number;
  beforeLine: number;
  from_ms: number;
  to_ms: number;
}

/** Steps longer than 1.5 × the usual step in a record sorted by time, first `limit` of them, oldest first. */
export function loggerGaps(time_ms: ArrayLike<number>, line: ArrayLike<number>, limit = 50): LoggerGap[] {
  const usual = usualStep_ms(time_ms);
  const out: LoggerGap[] = [];
  if (usual <= 0) return out;
  for (let i = 1; i < time_ms.length && out.length < limit; i++) {
    if (time_ms[i] - time_ms[i - 1] > 1.5 * usual) {
      out.push({ afterLine: line[i - 1], beforeLine: line[i], from_ms: time_ms[i - 1], to_ms: time_ms[i] });
    }
  }
  return out;
}
