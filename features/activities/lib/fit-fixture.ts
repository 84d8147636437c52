/**
 * Encodes an activity as a FIT file with the FIT SDK's own encoder: for test fixtures, the demo's invented files and the
 * bench. One record per entry of `seconds` (null entries are skipped, leaving a recording gap).
 */
import { Encoder, Profile, type Mesg } from "@garmin/fitsdk";

const MESG = { fileId: Profile.MesgNum.FILE_ID!, record: Profile.MesgNum.RECORD!, session: Profile.MesgNum.SESSION! };

export interface FitSecond {
  hrBpm?: number;
  powerW?: number;
  speedKmh?: number;
}

export function encodeFit(p: {
  start: Date;
  sport: "running" | "cycling" | "crossCountrySkiing" | "rowing" | "swimming" | "walking";
  seconds: (FitSecond | null)[];
}): Uint8Array {
  const encoder = new Encoder();
  const e = { onMesg: (num: number, m: Record<string, unknown>) => encoder.onMesg(num, m as unknown as Mesg) };
  const t0 = p.start.getTime();
  e.onMesg(MESG.fileId, {
    type: "activity",
    manufacturer: "development",
    product: 1,
    timeCreated: p.start,
    serialNumber: 4242,
  });
  let distance = 0,
    last = 0;
  p.seconds.forEach((s, i) => {
    if (!s) return;
    const metresPerS = s.speedKmh !== undefined ? s.speedKmh / 3.6 : 0;
    distance += metresPerS * (i - last);
    last = i;
    e.onMesg(MESG.record, {
      timestamp: new Date(t0 + i * 1000),
      ...(s.hrBpm !== undefined ? { heartRate: s.hrBpm } : {}),
      ...(s.powerW !== undefined ? { power: s.powerW } : {}),
      ...(s.speedKmh !== undefined ? { speed: metresPerS, distance } : {}),
    });
  });
  const end = new Date(t0 + p.seconds.length * 1000);
  e.onMesg(MESG.session, {
    timestamp: end,
    startTime: p.start,
    sport: p.sport,
    totalElapsedTime: p.seconds.length,
    totalTimerTime: p.seconds.length,
    messageIndex: 0,
  });
  return encoder.close();
}
