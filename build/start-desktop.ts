/** `npm start` (after the build): the desktop app in Electron, or a plain word on why not. See desktop-launch.ts. */
import { nodeLaunchDeps, startDesktop } from './desktop-launch'

process.exitCode = await startDesktop(nodeLaunchDeps(), process.argv.length > 2 ? process.argv.slice(2) : ['.'])
