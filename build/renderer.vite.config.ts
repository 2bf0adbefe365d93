/**
 * The window's production build (`npm run build:renderer`): renderer/vite.config.ts plus the
 * third-party notices of everything bundled into the window and its solver worker, written
 * as dist/renderer/third-party-notices.txt (served to the About box, shipped in the packages).
 */
import { readFileSync } from 'node:fs'
import { mergeConfig } from 'vite'
// With their extensions: Vite's native config loader (its future default) resolves no other way.
import rendererConfig from '../renderer/vite.config.ts'
import { projectPackageResolver, thirdPartyNotices } from './third-party-notices.ts'

const { version } = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string }

const notices = thirdPartyNotices({ heading: `Rodwave ${version}: third-party notices (the window)`, resolvePackage: projectPackageResolver() })

export default mergeConfig(rendererConfig, {
  plugins: [notices.plugin],
  worker: { plugins: () => [notices.collector()] },
})
