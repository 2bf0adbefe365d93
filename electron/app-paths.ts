/**
 * Where the app's own files are, from the source tree (`npm start`) and once packaged by
 * electron-builder (code inside app.asar, the examples beside it as extraResources).
 */
import { join } from 'node:path'

export const DEMO_PROJECT_FILE = 'cooling-water-pump-hanger.rodwave.json'
export const RECENT_FILES_FILE = 'recent-projects.json'

export interface AppLocation {
  readonly isPackaged: boolean
  /** app.getAppPath(): the repository root in development, …/resources/app.asar when packaged. */
  readonly appPath: string
  /** process.resourcesPath: the packaged app's resources folder. */
  readonly resourcesPath: string
}

/** The built renderer the app scheme serves. */
export function rendererRoot(location: AppLocation): string {
  return join(location.appPath, 'dist', 'renderer')
}

export function demoProjectPath(location: AppLocation): string {
  return location.isPackaged ? join(location.resourcesPath, 'examples', DEMO_PROJECT_FILE) : join(location.appPath, 'examples', DEMO_PROJECT_FILE)
}

/** The window icon on Linux (Windows and macOS take the icon from the packaged executable). */
export function windowIconPath(location: AppLocation): string {
  return location.isPackaged ? join(location.resourcesPath, 'icons', '512x512.png') : join(location.appPath, 'assets', 'icons', '512x512.png')
}
