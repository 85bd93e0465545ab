/**
 * The safety cautions Counterpoise shows where the work can hurt someone. They are general reminders of
 * common practice in field balancing, not a substitute for the machine manufacturer's manual, the site's
 * rules or local codes and licensed practice, which always come first.
 */

/** The moments of a balancing job that carry their own hazards. */
export const SAFETY_TOPICS = ['lockout', 'running', 'hot-work', 'weights', 'protection'] as const;

/** One moment of the job that carries its own hazards. */
export type SafetyTopic = (typeof SAFETY_TOPICS)[number];

/** One caution: a short title a technician can scan, and the detail. */
export interface SafetyCaution {
  /** The moment of the job the caution belongs to. */
  readonly topic: SafetyTopic;
  /** A few words that can be read at a glance. */
  readonly title: string;
  /** What to do, in one or two sentences. */
  readonly detail: string;
}

/** Every caution, in the order the job meets them. */
export const SAFETY_CAUTIONS: readonly SafetyCaution[] = [
  {
    topic: 'lockout',
    title: 'Lock out and tag out',
    detail:
      'Isolate and lock out the drive before you touch the rotor, block raised heads and decks, and wait until the rotor has stopped by itself.',
  },
  {
    topic: 'running',
    title: 'Guards on, people clear',
    detail:
      'Put every guard and cover back before each run. Nobody stands in line with the plane of the rotor while it turns: it can throw teeth, weights and debris a long way.',
  },
  {
    topic: 'running',
    title: 'Hands off a turning rotor',
    detail:
      'Fit sensors, cables and reflective tape only with the machine locked out, and route cables away from moving parts.',
  },
  {
    topic: 'hot-work',
    title: 'Hot work near fuel and debris',
    detail:
      'Clear dry debris, keep a fire watch and an extinguisher at hand, protect or disconnect electronics as the machine manual says, and follow the hot-work rules of the site.',
  },
  {
    topic: 'weights',
    title: 'Check every weight before the run',
    detail:
      'A weight that is badly welded or loosely bolted becomes a projectile. Inspect the weld or the fastener before the rotor turns again.',
  },
  {
    topic: 'protection',
    title: 'Protect eyes and ears',
    detail: 'Wear hearing and eye protection while the machine runs and while you grind or weld.',
  },
];

/** The cautions of the given topics, in job order; all of them when no topic is given. */
export function cautionsFor(topics: readonly SafetyTopic[] = []): readonly SafetyCaution[] {
  if (topics.length === 0) return SAFETY_CAUTIONS;
  return SAFETY_CAUTIONS.filter((caution) => topics.includes(caution.topic));
}
