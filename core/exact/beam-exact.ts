/**
 * The exact reference for bending of a straight part made of uniform Euler–Bernoulli members
 * with a steady axial force: the plain-number interface the model and the analyses call.
 */
export type { BeamChain, BeamEndCondition, BeamMember } from './beam-chain'
export { checkBeamChain, stationPositions } from './beam-chain'
export { beamRigidBodyModes } from './beam-rigid-body-modes'
export { beamModesBelow } from './beam-wittrick-williams'
export { exactBeamAngularFrequencies } from './beam-frequencies'
export { beamCriticalCompression } from './beam-buckling'
export { beamMemberDynamicStiffness } from './beam-transfer-matrix'
