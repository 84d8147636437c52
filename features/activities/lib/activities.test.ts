import { Decoder, Stream } from "@garmin/fitsdk";
import { describe, expect, it } from "vitest";
import { encodeFit, type FitSecond } from "./fit-fixture";
import { ActivityError, haversineM, readActivity } from "./read";
import { chooseMeasure, matchPlanned, summarise, toStreams, zoneTime } from "./streams";

const START = new Date("2026-11-30T07:00:00Z");

/** 20 min at 130 bpm / 150 W, 30 min at 150 bpm / 220 W, 10 min at 175 bpm / 300 W (hand-made profile). */
function threeBlocks(): FitSecond[] {
  const out: FitSecond[] = [];
  for (let i = 0; i < 3600; i++) {
    if (i < 1200) out.push({ hrBpm: 130, powerW: 150, speedKmh: 30 });
    else if (i < 3000) out.push({ hrBpm: 150, powerW: 220, speedKmh: 34 });
    else out.push({ hrBpm: 175, powerW: 300, speedKmh: 38 });
  }
  return out;
}

describe("FIT import (fixtures encoded with @garmin/fitsdk's Encoder)", () => {
  const bytes = encodeFit({ start: START, sport: "cycling", seconds: threeBlocks() });

  it("reads the records, sport and start time", () => {
    const a = readActivity("ride.fit", bytes);
    expect(a.format).toBe("fit");
    expect(a.sport).toBe("cycling");
    expect(a.startTime?.toISOString()).toBe(START.toISOString());
    expect(a.samples.length).toBe(3600);
  });

  it("time in zone matches the hand count: 20 / 30 / 10 min by heart rate with VT1 140 and VT2 165 bpm", () => {
    const a = readActivity("ride.fit", bytes);
    const s = toStreams(a.samples);
    const z = zoneTime(s, "hrBpm", 140, 165);
    expect(z.secondsByZone).toEqual([1200, 1800, 600]);
    expect(z.minutesByZone).toEqual([20, 30, 10]);
    expect(z.secondsWithoutData).toBe(0);
  });

  it("agrees with counting the SDK decoder's own records (cross-check), by power with VT1 200 W and VT2 280 W", () => {
    const { messages } = new Decoder(Stream.fromByteArray(bytes)).read();
    const bySdk = [0, 0, 0];
    for (const r of messages.recordMesgs!) bySdk[(r.power as number) < 200 ? 0 : (r.power as number) < 280 ? 1 : 2]!++;
    const ours = zoneTime(toStreams(readActivity("ride.fit", bytes).samples), "powerW", 200, 280);
    expect(ours.secondsByZone).toEqual(bySdk);
  });

  it("summarises averages and distance (hand computed: (30·20 + 34·30 + 38·10) km/h·min ÷ 60 = 33.33 km)", () => {
    const a = readActivity("ride.fit", bytes);
    const sum = summarise(a.samples, toStreams(a.samples));
    expect(sum.hrAvgBpm).toBeCloseTo((130 * 1200 + 150 * 1800 + 175 * 600) / 3600, 6);
    expect(sum.powerAvgW).toBeCloseTo((150 * 1200 + 220 * 1800 + 300 * 600) / 3600, 6);
    expect(sum.distanceKm).toBeCloseTo(2000 / 60, 1);
    expect(sum.channels).toEqual(["hrBpm", "powerW", "speedKmh"]);
  });

  it("carries a value up to 5 s over a recording gap and leaves a longer gap empty", () => {
    const seconds: (FitSecond | null)[] = Array.from({ length: 200 }, (_, i) =>
      i >= 100 && i < 160 ? null : { hrBpm: 120 },
    );
    const a = readActivity("gap.fit", encodeFit({ start: START, sport: "running", seconds }));
    const z = zoneTime(toStreams(a.samples), "hrBpm", 140, 165);
    // Records at 0–99 and 160–199: seconds 100–104 carry the value of 99, 105–159 (55 s) are a gap.
    expect(z.secondsWithoutData).toBe(55);
    expect(z.secondsByZone[0]).toBe(145);
  });

  it("refuses a truncated FIT file with a reason and reads nothing", () => {
    expect(() => readActivity("ride.fit", bytes.slice(0, Math.floor(bytes.length / 2)))).toThrow(
      /damaged or cut short/,
    );
  });

  it("refuses a FIT file with a flipped byte (checksum)", () => {
    const broken = bytes.slice();
    broken[500] = broken[500]! ^ 0xff;
    expect(() => readActivity("ride.fit", broken)).toThrow(ActivityError);
  });

  it("refuses empty files, binary garbage, archives and oversized files", () => {
    expect(() => readActivity("x.fit", new Uint8Array())).toThrow(/empty/);
    expect(() => readActivity("x.fit", new Uint8Array(64).fill(7))).toThrow(/no FIT header/);
    expect(() => readActivity("x.bin", Uint8Array.from([0, 255, 254, 1, 2, 3, 0, 0, 9]))).toThrow(ActivityError);
    expect(() => readActivity("x.zip", Uint8Array.from([0x50, 0x4b, 3, 4, 0, 0]))).toThrow(/Zip/);
    expect(() => readActivity("x.gz", Uint8Array.from([0x1f, 0x8b, 8, 0]))).toThrow(/Compressed/);
    expect(() => readActivity("x.csv", new Uint8Array(25 * 1024 * 1024 + 1))).toThrow(/25 MB/);
  });
});

const tcx = (points: string) => `<?xml version="1.0" encoding="UTF-8"?>
<TrainingCenterDatabase xmlns="http://www.garmin.com/xmlschemas/TrainingCenterDatabase/v2" xmlns:ns3="http://www.garmin.com/xmlschemas/ActivityExtension/v2">
  <Activities><Activity Sport="Running"><Id>2026-11-30T07:00:00Z</Id><Lap StartTime="2026-11-30T07:00:00Z"><Track>${points}</Track></Lap></Activity></Activities>
</TrainingCenterDatabase>`;

const tp = (s: number, hr: number, dist: number) =>
  `<Trackpoint><Time>${new Date(START.getTime() + s * 1000).toISOString()}</Time><DistanceMeters>${dist}</DistanceMeters><HeartRateBpm><Value>${hr}</Value></HeartRateBpm></Trackpoint>`;

describe("TCX import (hand-written fixture, fast-xml-parser)", () => {
  // Points every 2 s for 10 min: heart rate 135 for the first 4 min, 155 for the next 4, 170 for the last 2; 3 m/s.
  const points = Array.from({ length: 301 }, (_, k) =>
    tp(2 * k, 2 * k < 240 ? 135 : 2 * k < 480 ? 155 : 170, 6 * k),
  ).join("");
  const file = new TextEncoder().encode(tcx(points));

  it("reads sport, heart rate and distance; speed comes from the distance", () => {
    const a = readActivity("run.tcx", file);
    expect(a.sport).toBe("running");
    const sum = summarise(a.samples, toStreams(a.samples));
    expect(sum.distanceKm).toBeCloseTo(1.8, 6);
    expect(sum.speedAvgKmh).toBeCloseTo(10.8, 6);
  });

  it("time in zone by hand: 240 s, 240 s and 121 s (the 1 Hz stream runs 0–600 s)", () => {
    const a = readActivity("run.tcx", file);
    const z = zoneTime(toStreams(a.samples), "hrBpm", 145, 165);
    expect(z.secondsByZone).toEqual([240, 240, 121]);
  });

  it("refuses broken XML and a TCX without an activity", () => {
    expect(() => readActivity("run.tcx", new TextEncoder().encode(tcx(points).slice(0, 500)))).toThrow(ActivityError);
    expect(() =>
      readActivity("run.tcx", new TextEncoder().encode("<TrainingCenterDatabase></TrainingCenterDatabase>")),
    ).toThrow(/no activity/);
  });
});

describe("GPX import (hand-written fixture)", () => {
  it("haversine: 0.001° of latitude is 111.195 m on the mean Earth sphere (π·6 371 008.8 m / 180 000)", () => {
    expect(haversineM(0, 0, 0.001, 0)).toBeCloseTo((Math.PI * 6_371_008.8) / 180_000, 3);
  });

  it("reads track points with heart rate from the TrackPointExtension and builds speed from positions", () => {
    const pts = Array.from(
      { length: 61 },
      (_, k) =>
        `<trkpt lat="${(k * 0.00003).toFixed(5)}" lon="0"><time>${new Date(START.getTime() + k * 1000).toISOString()}</time><extensions><gpxtpx:TrackPointExtension><gpxtpx:hr>${140 + (k % 3)}</gpxtpx:hr></gpxtpx:TrackPointExtension></extensions></trkpt>`,
    ).join("");
    const gpx = `<?xml version="1.0"?><gpx version="1.1" creator="test" xmlns:gpxtpx="http://www.garmin.com/xmlschemas/TrackPointExtension/v1"><trk><type>running</type><trkseg>${pts}</trkseg></trk></gpx>`;
    const a = readActivity("run.gpx", new TextEncoder().encode(gpx));
    expect(a.sport).toBe("running");
    const sum = summarise(a.samples, toStreams(a.samples));
    // 60 steps of 0.00003° latitude: 60 × 3.33585 m = 200.15 m; speed 3.33585 m/s = 12.009 km/h.
    expect(sum.distanceKm! * 1000).toBeCloseTo(60 * haversineM(0, 0, 0.00003, 0), 3);
    expect(sum.speedAvgKmh).toBeCloseTo(haversineM(0, 0, 0.00003, 0) * 3.6, 2);
    expect(sum.hrAvgBpm).toBeCloseTo(141, 0);
  });

  it("refuses a GPX without time stamps", () => {
    expect(() =>
      readActivity(
        "x.gpx",
        new TextEncoder().encode(`<gpx><trk><trkseg><trkpt lat="1" lon="1"></trkpt></trkseg></trk></gpx>`),
      ),
    ).toThrow(/no samples/);
  });
});

describe("CSV activity import", () => {
  it("reads time as seconds or mm:ss, with heart rate and power", () => {
    const csv = "time,hr_bpm,power_w\n00:00,120,150\n00:01,121,151\n00:02,122,152\n";
    const a = readActivity("ride.csv", new TextEncoder().encode(csv));
    expect(a.samples.length).toBe(3);
    expect(summarise(a.samples, toStreams(a.samples)).powerAvgW).toBeCloseTo(151, 6);
  });

  it("refuses a CSV without time or without any measured column, naming what is missing", () => {
    expect(() => readActivity("x.csv", new TextEncoder().encode("hr,power\n1,2\n"))).toThrow(/no time column/);
    expect(() => readActivity("x.csv", new TextEncoder().encode("time,cadence\n1,80\n"))).toThrow(
      /none of the columns/,
    );
  });

  it("drops impossible values with a warning instead of counting them", () => {
    const csv = "time_s,hr_bpm\n0,140\n1,900\n2,141\n";
    const a = readActivity("x.csv", new TextEncoder().encode(csv));
    expect(a.warnings.join(" ")).toMatch(/heart-rate value/);
    expect(summarise(a.samples, toStreams(a.samples, 0)).hrAvgBpm).toBeCloseTo(140.5, 6);
  });
});

describe("measure choice and matching (our rules)", () => {
  it("prefers power, then heart rate, then speed — only where the zone set has that measure", () => {
    expect(chooseMeasure(["hrBpm", "powerW"], { hrBpm: 140, powerW: 200 }, { hrBpm: 165, powerW: 280 })).toBe("powerW");
    expect(chooseMeasure(["hrBpm", "powerW"], { hrBpm: 140 }, { hrBpm: 165 })).toBe("hrBpm");
    expect(chooseMeasure(["speedKmh"], { hrBpm: 140 }, { hrBpm: 165 })).toBeNull();
  });

  it("matches the same sport with the nearest planned duration", () => {
    const c = [
      { id: "a", sport: "running", totalS: 3600 },
      { id: "b", sport: "cycling", totalS: 5400 },
      { id: "c", sport: "cycling", totalS: 3000 },
    ];
    expect(matchPlanned(c, "cycling", 3300)).toBe("c");
    expect(matchPlanned(c, "cycling", 5000)).toBe("b");
    expect(matchPlanned(c, "rowing", 3000)).toBeNull();
    expect(matchPlanned(c, null, 3500)).toBe("a");
  });
});
