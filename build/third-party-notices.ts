/**
 * Third-party notices, generated at build time from the packages whose code is actually in
 * the bundle: a Vite plugin reads the module ids of every output chunk (the window, its
 * solver worker, the main process, the preload), finds the package each comes from, and
 * writes `third-party-notices.txt` beside the bundle with each package's name, version,
 * declared licence and the full text of its licence and notice files (Apache-2.0 asks for
 * the NOTICE file as well, section 4(d)). A bundled package without a licence file stops
 * the build: nothing ships without its notice.
 */
import { existsSync } from 'node:fs'
import { readdir, readFile, stat } from 'node:fs/promises'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { Plugin } from 'vite'

export const NOTICES_FILE = 'third-party-notices.txt'

/** Code that build tools copy into every bundle, under virtual ids rather than a node_modules path. */
const VIRTUAL_MODULE_PACKAGES: readonly [RegExp, string][] = [
  [/^\0?vite\//, 'vite'],
  [/^\0?plugin-vue:/, '@vitejs/plugin-vue'],
  [/^\0?rolldown[:/]/, 'rolldown'],
]

/** Licence, notice and copyright files by their usual names (LICENSE, LICENCE.md, NOTICE, COPYING, CopyrightNotice.txt, …). */
const NOTICE_FILE = /^(licen[cs]e|notice|copying|copyright\w*)([.-][\w.-]*)?$/i
/** Folders some packages keep the licences of code they include in (ECharts: licenses/LICENSE-d3). */
const NOTICE_FOLDER = /^licen[cs]es$/i

export interface NoticeText {
  /** The file's path inside its package, e.g. "LICENSE" or "licenses/LICENSE-d3". */
  readonly file: string
  readonly text: string
}

export interface BundledPackage {
  readonly name: string
  readonly version: string
  /** The SPDX expression of package.json's `license`. */
  readonly license: string
  readonly homepage: string | null
  readonly notices: readonly NoticeText[]
}

/**
 * The folder of the package a module comes from: the part of its path up to and including
 * the package name after the last node_modules (scoped names take two segments). Null for
 * the project's own files and for virtual modules.
 */
export function packageFolderOf(moduleId: string): string | null {
  const path = moduleId.replace(/[?#].*$/, '').replace(/\\/g, '/')
  if (path.startsWith('\0')) return null
  const marker = '/node_modules/'
  const at = path.lastIndexOf(marker)
  if (at < 0) return null
  const rest = path.slice(at + marker.length).split('/')
  const segments = rest[0]?.startsWith('@') ? 2 : 1
  if (rest.length <= segments || rest.slice(0, segments).some((segment) => segment === '')) return null
  return path.slice(0, at + marker.length) + rest.slice(0, segments).join('/')
}

/** The package a virtual module's code comes from (a build tool's helper), if any. */
export function virtualModulePackage(moduleId: string): string | null {
  return VIRTUAL_MODULE_PACKAGES.find(([pattern]) => pattern.test(moduleId))?.[1] ?? null
}

async function noticeTexts(folder: string): Promise<NoticeText[]> {
  const texts: NoticeText[] = []
  const names = (await readdir(folder)).sort()
  for (const name of names) {
    const path = join(folder, name)
    const info = await stat(path)
    if (info.isFile() && NOTICE_FILE.test(name)) {
      texts.push({ file: name, text: await readFile(path, 'utf8') })
    } else if (info.isDirectory() && NOTICE_FOLDER.test(name)) {
      for (const inner of (await readdir(path)).sort()) {
        if ((await stat(join(path, inner))).isFile()) texts.push({ file: `${name}/${inner}`, text: await readFile(join(path, inner), 'utf8') })
      }
    }
  }
  return texts
}

/** Reads one package's name, version, licence and notice texts from its folder. */
export async function readBundledPackage(folder: string): Promise<BundledPackage> {
  const manifest = JSON.parse(await readFile(join(folder, 'package.json'), 'utf8')) as {
    name?: string
    version?: string
    license?: string | { type?: string }
    homepage?: string
  }
  const name = manifest.name ?? folder
  const license = typeof manifest.license === 'string' ? manifest.license : (manifest.license?.type ?? 'UNKNOWN')
  const notices = await noticeTexts(folder)
  if (notices.length === 0) throw new Error(`third-party notices: ${name} (${folder}) is bundled but has no licence file to ship with it`)
  return { name, version: manifest.version ?? '?', license, homepage: manifest.homepage ?? null, notices }
}

/**
 * Every package whose code is among `moduleIds` (the bundle's modules), by name; the same
 * package reached at two versions is listed twice. `resolvePackage` finds a build tool's
 * own folder for its virtual modules.
 */
export async function collectBundledPackages(moduleIds: Iterable<string>, resolvePackage: (name: string) => string | null): Promise<BundledPackage[]> {
  const folders = new Set<string>()
  for (const id of moduleIds) {
    const folder = packageFolderOf(id) ?? (() => {
      const tool = virtualModulePackage(id)
      return tool === null ? null : resolvePackage(tool)
    })()
    if (folder !== null) folders.add(folder)
  }
  const packages = await Promise.all([...folders].map(readBundledPackage))
  const unique = new Map(packages.map((p) => [`${p.name}@${p.version}`, p]))
  return [...unique.values()].sort((a, b) => a.name.localeCompare(b.name) || a.version.localeCompare(b.version))
}

const RULE = '='.repeat(78)

/** The notices file: a list of the packages, then each package's licence and notice texts in full. */
export function noticesText(packages: readonly BundledPackage[], heading: string): string {
  const lines = [
    heading,
    '',
    ...(packages.length === 0
      ? ['Rodwave itself is MIT-licensed (see LICENSE). This part of it includes no third-party software.', '']
      : [
          'Rodwave itself is MIT-licensed (see LICENSE). It includes the following third-party software,',
          'each under its own licence, reproduced in full below.',
          '',
          ...packages.map((p) => `  ${p.name} ${p.version} (${p.license})`),
          '',
        ]),
  ]
  for (const p of packages) {
    lines.push(RULE, `${p.name} ${p.version}`, `Licence: ${p.license}`)
    if (p.homepage) lines.push(`Home: ${p.homepage}`)
    for (const notice of p.notices) lines.push('', `--- ${notice.file} ---`, '', notice.text.trimEnd())
    lines.push('')
  }
  return `${lines.join('\n')}\n`
}

export interface NoticesOptions {
  /** The first line of the file. */
  readonly heading: string
  /** The file's name in the output folder (default third-party-notices.txt). */
  readonly fileName?: string
  /** Only for the build environment of this name (Vite's environments: "client", or the desktop shell's "main", "preload"). */
  readonly environment?: string
  /** Write the file even when nothing third-party is bundled (default true). */
  readonly writeWhenEmpty?: boolean
  /** Where a build tool's package is, for its helpers copied into the bundle (null: not installed). */
  readonly resolvePackage: (name: string) => string | null
}

export interface NoticesPlugins {
  /** For a build that writes the notices file beside its output (the window; main and preload). */
  readonly plugin: Plugin
  /** For a nested build whose modules count too (the solver worker); writes nothing itself. */
  readonly collector: () => Plugin
}

/**
 * The plugins: `plugin` collects the modules of its own build, `collector` those of builds
 * nested in it (Vite builds the worker while it builds the window), and `plugin` writes the
 * notices of them all. Vite evaluates the config once per environment, so builds of
 * separate environments (main, preload) each need an instance of their own.
 */
export function thirdPartyNotices(options: NoticesOptions): NoticesPlugins {
  const seen = new Set<string>()
  const remember = (bundle: Record<string, { type: string; moduleIds?: readonly string[] }>) => {
    for (const output of Object.values(bundle)) if (output.type === 'chunk') for (const id of output.moduleIds ?? []) seen.add(id)
  }
  return {
    plugin: {
      name: 'rodwave:third-party-notices',
      apply: 'build',
      ...(options.environment === undefined ? {} : { applyToEnvironment: (environment: { name: string }) => environment.name === options.environment }),
      async generateBundle(_options, bundle) {
        remember(bundle)
        const packages = await collectBundledPackages(seen, options.resolvePackage)
        if (packages.length === 0 && options.writeWhenEmpty === false) return
        this.emitFile({ type: 'asset', fileName: options.fileName ?? NOTICES_FILE, source: noticesText(packages, options.heading) })
      },
    },
    collector: () => ({
      name: 'rodwave:third-party-notices-collector',
      apply: 'build',
      generateBundle(_options, bundle) {
        remember(bundle)
      },
    }),
  }
}

/** Finds an installed package's folder under the project's node_modules (for build tools' helpers). */
export function projectPackageResolver(projectRoot: string = fileURLToPath(new URL('..', import.meta.url))): (name: string) => string | null {
  return (name) => {
    const folder = join(projectRoot, 'node_modules', name)
    return existsSync(join(folder, 'package.json')) ? folder : null
  }
}
