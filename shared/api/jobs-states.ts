// A job's states and the fixed lists the jobs contract names: reading depths and axes, photo limits.
import type { Axis, Depth } from '../bore-wear';

/**
 * States a person may move a job between, in workshop order; handing back and calling off have their
 * own commands.
 */
export const OPEN_STATES = [
  'booked_in',
  'gauged',
  'parts_set_aside',
  'on_the_bar',
  'at_the_hone',
  'ready_to_go',
] as const;
export type OpenState = (typeof OPEN_STATES)[number];

/** A job's states in workshop order; the last two close the job. */
export const JOB_STATES = [...OPEN_STATES, 'handed_back', 'called_off'] as const;
export type JobState = (typeof JOB_STATES)[number];

export const JOB_STATE_LABELS: Record<JobState, string> = {
  booked_in: 'Booked in',
  gauged: 'Gauged',
  parts_set_aside: 'Parts set aside',
  on_the_bar: 'On the bar',
  at_the_hone: 'At the hone',
  ready_to_go: 'Ready to go',
  handed_back: 'Handed back',
  called_off: 'Called off',
};

export const JOB_STATE_HINTS: Record<JobState, string> = {
  booked_in: 'Taken in; bores not measured yet.',
  gauged: 'Bores measured; choose the step and set the piston aside.',
  parts_set_aside: 'Each measured piston is held for its cylinder.',
  on_the_bar: 'Boring.',
  at_the_hone: 'Honing, chamfering ports, measuring, cleaning.',
  ready_to_go: 'Finished; waiting for the customer.',
  handed_back: 'Collected; the held parts were issued.',
  called_off: 'Cancelled; every hold was released.',
};

export function isOpenState(state: string): state is OpenState {
  return (OPEN_STATES as readonly string[]).includes(state);
}

export const READING_DEPTHS = ['top', 'middle', 'bottom'] as const satisfies readonly Depth[];
export const READING_AXES = ['pin', 'thrust'] as const satisfies readonly Axis[];
export const DEPTH_LABELS: Record<Depth, string> = {
  top: 'Top of ring travel',
  middle: 'Middle',
  bottom: 'Bottom of travel',
};
export const AXIS_LABELS: Record<Axis, string> = {
  pin: 'Along the pin',
  thrust: 'Across (thrust)',
};

/** Most photos one job keeps; intake needs a handful, not an album. */
export const MAX_PHOTOS_PER_JOB = 24;
/** Largest photo accepted, in bytes (10 MB). */
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024;
/** Largest thumbnail the browser may send with a photo. */
export const MAX_THUMBNAIL_BYTES = 512 * 1024;
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
