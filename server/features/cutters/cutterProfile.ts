import { profileWith, type CutterProfile, type OriginCorner } from '../../../shared/cutplan/profile.js'
import type { CutterRow } from './cutters.repo.js'

type ProfileFields = Pick<CutterRow, 'name' | 'cutSpeedMmS' | 'travelSpeedMmS' | 'accelerationMmS2' | 'liftLowerS' | 'cornerAngleDeg' | 'origin' | 'swapAxes'>

/** A stored cutter as a cut-plan profile: its speeds, acceleration, lift time, origin and axes time and export a plan. */
export function profileOfCutter(cutter: ProfileFields): CutterProfile {
  return profileWith({
    name: cutter.name.slice(0, 80),
    cutSpeedMmS: cutter.cutSpeedMmS,
    travelSpeedMmS: cutter.travelSpeedMmS,
    accelerationMmS2: cutter.accelerationMmS2,
    liftLowerS: cutter.liftLowerS,
    cornerAngleDeg: cutter.cornerAngleDeg,
    origin: cutter.origin as OriginCorner,
    swapAxes: cutter.swapAxes,
  })
}
