import type { CutterProfile } from './profile.js'

type Point = readonly [number, number]

/**
 * Time of one move of length d that starts and ends at rest, top speed v, acceleration a (trapezoidal profile,
 * elementary kinematics): if d ≥ v²/a the carriage reaches v, t = d/v + v/a; otherwise it only accelerates to the
 * middle and brakes (triangular), t = 2√(d/a).
 */
export function moveTimeS(distanceMm: number, speedMmS: number, accelerationMmS2: number): number {
  if (!(distanceMm > 0)) return 0
  if (distanceMm >= (speedMmS * speedMmS) / accelerationMmS2) return distanceMm / speedMmS + speedMmS / accelerationMmS2
  return 2 * Math.sqrt(distanceMm / accelerationMmS2)
}

/**
 * Lengths of the stretches of a traced path between corners sharper than `cornerAngleDeg`: the carriage stops at such
 * a corner and runs through gentler turns (a flattened curve is one move, not hundreds). Cost: linear in the points.
 */
export function runLengths(path: readonly Point[], cornerAngleDeg: number): number[] {
  const runs: number[] = []
  const limit = (cornerAngleDeg * Math.PI) / 180
  let current = 0
  let previousDx = 0
  let previousDy = 0
  for (let index = 1; index < path.length; index++) {
    const dx = path[index]![0] - path[index - 1]![0]
    const dy = path[index]![1] - path[index - 1]![1]
    const length = Math.hypot(dx, dy)
    if (length === 0) continue
    if (current > 0) {
      const turn = Math.abs(Math.atan2(previousDx * dy - previousDy * dx, previousDx * dx + previousDy * dy))
      if (turn > limit) {
        runs.push(current)
        current = 0
      }
    }
    current += length
    previousDx = dx
    previousDy = dy
  }
  if (current > 0) runs.push(current)
  return runs
}

/** Time to cut a traced path (blade down) with the profile: each run between sharp corners is one trapezoidal move. */
export function cutPathTimeS(path: readonly Point[], profile: CutterProfile): number {
  return runLengths(path, profile.cornerAngleDeg).reduce((sum, run) => sum + moveTimeS(run, profile.cutSpeedMmS, profile.accelerationMmS2), 0)
}

/** Time of one pen-up move in a straight line. */
export function travelTimeS(distanceMm: number, profile: CutterProfile): number {
  return moveTimeS(distanceMm, profile.travelSpeedMmS, profile.accelerationMmS2)
}
