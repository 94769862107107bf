// The camera on the yard vehicle: a pinhole looking along the quay, with the horizon above the image
// centre so most of the frame shows ground. World axes: X to the right of the start heading, Y up,
// Z forward, metres; the quay deck is the plane Y = 0.

/** Intrinsics (pixels) and pose (metres, radians) of the demo camera for one frame. */
export interface DemoCamera {
  width: number;
  height: number;
  /** Focal length in pixels. */
  f: number;
  /** Principal point in pixels; row `cy` is the horizon. */
  cx: number;
  cy: number;
  x: number;
  /** Height of the lens above the deck. */
  y: number;
  z: number;
  /** Heading: 0 looks along +Z, positive turns right (towards +X). */
  yaw: number;
  cos: number;
  sin: number;
  /** Frame index, the clock of moving things (one unit per frame). */
  time: number;
}

/** Returns the distance the vehicle has driven by frame `index`, in metres. */
export function demoTravel(index: number, frames: number): number {
  const step = frames > 1 ? Math.min(0.8, 60 / (frames - 1)) : 0.8;
  return step * index;
}

/** Returns the camera of frame `index` (0-based) of a `frames`-long sequence at width×height pixels. */
export function demoCamera(index: number, frames: number, width: number, height: number): DemoCamera {
  const d = demoTravel(index, frames);
  // A slow drift to the right and back, and a gentle left turn: enough for the perspective to change.
  const yaw = 0.05 * Math.sin(d / 30 + 0.6) - 0.0022 * d;
  const f = 0.56 * Math.min(width, 2 * height);
  return {
    width,
    height,
    f,
    cx: width / 2,
    cy: height * 0.4,
    x: 1.1 * Math.sin(d / 25),
    y: 4 + 0.015 * Math.sin(index * 2.1),
    z: d,
    yaw,
    cos: Math.cos(yaw),
    sin: Math.sin(yaw),
    time: index,
  };
}
