/**
 * The templates a new squad starts with: two or three per sport, our own names and structures (common practice shapes:
 * an easy session, a threshold session between the thresholds, and intervals above VT2). Coaches edit, copy or delete
 * them like any other.
 */
import type { Sport } from "@/features/platform/lib/sports";
import type { Block } from "./session";

/** One timed step and a repeat group: shorthands for writing structures by hand. */
export const step = (kind: "warmup" | "work" | "recovery" | "cooldown", min: number, zone: 1 | 2 | 3): Block => ({
  type: "step",
  kind,
  durationS: min * 60,
  zone,
});
export const repeat = (times: number, ...steps: Block[]): Block => ({ type: "repeat", times, steps });

export interface StarterTemplate {
  name: string;
  sport: Sport;
  description: string;
  structure: Block[];
}

export const STARTER_TEMPLATES: StarterTemplate[] = [
  {
    name: "Easy run 45 min",
    sport: "running",
    description: "Conversational throughout.",
    structure: [step("work", 45, 1)],
  },
  {
    name: "Steady run 3 × 8 min",
    sport: "running",
    description: "Between the thresholds, easy jog between.",
    structure: [step("warmup", 15, 1), repeat(3, step("work", 8, 2), step("recovery", 3, 1)), step("cooldown", 10, 1)],
  },
  {
    name: "Run intervals 5 × 3 min",
    sport: "running",
    description: "Above VT2, equal easy jog between.",
    structure: [step("warmup", 15, 1), repeat(5, step("work", 3, 3), step("recovery", 3, 1)), step("cooldown", 10, 1)],
  },
  {
    name: "Long easy ride 2 h",
    sport: "cycling",
    description: "Low zone, steady cadence.",
    structure: [step("work", 120, 1)],
  },
  {
    name: "Ride 2 × 15 min steady",
    sport: "cycling",
    description: "Between the thresholds.",
    structure: [step("warmup", 15, 1), repeat(2, step("work", 15, 2), step("recovery", 5, 1)), step("cooldown", 10, 1)],
  },
  {
    name: "Ride intervals 5 × 4 min",
    sport: "cycling",
    description: "Above VT2, easy spinning between.",
    structure: [step("warmup", 20, 1), repeat(5, step("work", 4, 3), step("recovery", 4, 1)), step("cooldown", 15, 1)],
  },
  {
    name: "Easy row 50 min",
    sport: "rowing",
    description: "Low rate, long strokes.",
    structure: [step("work", 50, 1)],
  },
  {
    name: "Row pieces 5 × 3 min",
    sport: "rowing",
    description: "Above VT2, easy paddling between.",
    structure: [step("warmup", 15, 1), repeat(5, step("work", 3, 3), step("recovery", 3, 1)), step("cooldown", 10, 1)],
  },
  {
    name: "Easy swim 40 min",
    sport: "swimming",
    description: "Technique and easy aerobic lengths.",
    structure: [step("work", 40, 1)],
  },
  {
    name: "Swim 8 × 2 min",
    sport: "swimming",
    description: "Strong, with a minute's rest.",
    structure: [step("warmup", 10, 1), repeat(8, step("work", 2, 3), step("recovery", 1, 1)), step("cooldown", 5, 1)],
  },
  {
    name: "Brisk walk 40 min",
    sport: "walking",
    description: "Walk with purpose, able to talk.",
    structure: [step("work", 40, 1)],
  },
  {
    name: "Hill walk 5 × 3 min",
    sport: "walking",
    description: "Uphill efforts, easy down.",
    structure: [step("warmup", 10, 1), repeat(5, step("work", 3, 2), step("recovery", 2, 1)), step("cooldown", 10, 1)],
  },
  {
    name: "Easy ski 60 min",
    sport: "cross_country_skiing",
    description: "Easy terrain, long glides.",
    structure: [step("work", 60, 1)],
  },
  {
    name: "Ski climbs 4 × 5 min",
    sport: "cross_country_skiing",
    description: "Hard climbs, easy back down.",
    structure: [step("warmup", 20, 1), repeat(4, step("work", 5, 3), step("recovery", 4, 1)), step("cooldown", 15, 1)],
  },
  {
    name: "Easy brick: ride then run",
    sport: "triathlon",
    description: "Ride easy, run off the bike a little quicker.",
    structure: [step("work", 60, 1), step("work", 15, 2)],
  },
];
