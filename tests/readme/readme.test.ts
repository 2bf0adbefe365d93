/**
 * README stays true: its sample project is a valid file and is the example it says it is, every
 * field used in it (and in the other examples) is named in the text, the output it prints is
 * what the command prints, the exit codes and the `solve --json` fields it lists are the real
 * ones, the Node version it recommends is the one the tools declare, and its test command is the
 * one CI runs and needs no `sudo` in a root shell. The expected values are the program's own
 * output only where README shows that output; what is checked is that README matches it.
 */
import { describe, expect, test } from 'vitest'
import { execFile } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { promisify } from 'node:util'
import { EXIT } from '../../bin/cli-common'
import { readProjectText } from '../../core/model/project-schema'
import { run } from '../cli/cli-harness'

const README = readFileSync('README.md', 'utf8')

/** The text of a `## ` section of README, up to the next one. */
function section(title: string): string {
  const start = README.indexOf(`\n## ${title}\n`)
  expect(start, `README has a "## ${title}" section`).toBeGreaterThan(0)
  const end = README.indexOf('\n## ', start + 1)
  return README.slice(start, end < 0 ? undefined : end)
}

/** The fenced blocks of a piece of README with their language. */
function blocks(text: string): { lang: string; body: string }[] {
  return [...text.matchAll(/^```(\w*)\n([\s\S]*?)^```$/gm)].map((m) => ({ lang: m[1], body: m[2] }))
}

/** Every object key in a JSON value, at any depth. */
function keysOf(value: unknown, into = new Set<string>()): Set<string> {
  if (Array.isArray(value)) value.forEach((v) => keysOf(v, into))
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      into.add(k)
      keysOf(v, into)
    }
  }
  return into
}

describe('the sample project', () => {
  const projectSection = section('Project file')
  const sample = blocks(projectSection).find((b) => b.lang === 'json')!

  test('is a valid Rodwave project', () => {
    const read = readProjectText(sample.body)
    expect(read.ok ? [] : read.issues).toEqual([])
  })

  test('is the demo part it says it is, as a whole', () => {
    const named = /`(examples\/[\w.-]+\.rodwave\.json)`/.exec(projectSection)![1]
    expect(JSON.parse(sample.body)).toEqual(JSON.parse(readFileSync(named, 'utf8')))
  })

  test.each(['examples/condensate-pump-hanger.rodwave.json', 'examples/die-cushion-actuator-rod.rodwave.json', 'examples/fan-housing-tie-rod.rodwave.json'])(
    'every field used in %s (and so in the sample) is named in "Project file"',
    (file) => {
      const keys = keysOf(JSON.parse(readFileSync(file, 'utf8')))
      const missing = [...keys].filter((k) => !projectSection.includes(`\`${k}\``) && !projectSection.includes(`\`${k}[]\``))
      expect(missing).toEqual([])
    },
  )
  test('the spring\'s stiffness is among them', () => {
    expect(keysOf(JSON.parse(readFileSync('examples/die-cushion-actuator-rod.rodwave.json', 'utf8'))).has('stiffness')).toBe(true)
    expect(projectSection).toContain('`stiffness`')
  })
})

describe('the command line section', () => {
  const cli = section('Command line')

  // Shown lines against the real output: text cells exactly; numbers to 1e-9 relative or 1e-12
  // absolute (round-off may move the last printed digit of a difference such as error_vs_reference).
  test('every printed example is what the command prints', async () => {
    const examples = blocks(cli).filter((b) => b.lang === 'sh' && b.body.startsWith('$ '))
    expect(examples.length).toBeGreaterThan(0)
    for (const example of examples) {
      const [commandLine, ...shown] = example.body.trimEnd().split('\n')
      const args = commandLine.replace(/^\$ (npm run --silent rodwave --|rodwave) /, '').split(/\s+/)
      const result = await run(args)
      expect(result.code, result.stderr).toBe(EXIT.done)
      const actual = result.stdout.split(/\r?\n/)
      const truncated = shown.at(-1) === '…'
      const lines = truncated ? shown.slice(0, -1) : shown
      if (!truncated) expect(actual.filter(Boolean).length).toBe(lines.length)
      else expect(actual.filter(Boolean).length).toBeGreaterThan(lines.length)
      lines.forEach((line, i) => {
        const cells = line.split(',')
        const real = actual[i].split(',')
        expect(real.length, `line ${i + 1}`).toBe(cells.length)
        cells.forEach((cell, j) => {
          const a = Number(real[j])
          const b = Number(cell)
          if (cell !== '' && Number.isFinite(b)) {
            expect(Math.abs(a - b), `line ${i + 1}, cell ${j + 1}: README ${cell}, real ${real[j]}`).toBeLessThanOrEqual(1e-9 * Math.abs(b) + 1e-12)
          } else {
            expect(real[j], `line ${i + 1}, cell ${j + 1}`).toBe(cell)
          }
        })
      })
    }
  })

  test('the exit codes listed are the real ones', () => {
    const paragraph = /Exit codes: ([\s\S]*?)\n\n/.exec(cli)![1]
    const listed = [...paragraph.matchAll(/(?:^|· )(\d) /g)].map((m) => Number(m[1]))
    expect(listed).toEqual(Object.values(EXIT))
  })

  test('every field of the solve --json document is named', async () => {
    const doc = JSON.parse((await run(['solve', 'examples/condensate-pump-hanger.rodwave.json'])).stdout)
    const paragraph = cli.slice(cli.indexOf('`solve --json` prints'))
    const names = new Set([...Object.keys(doc), ...Object.keys(doc.modes[0]), ...Object.keys(doc.resonance[0]), ...Object.keys(doc.timing), 'startupMs'])
    const missing = [...names].filter((k) => !new RegExp(`\\b${k}\\b`).test(paragraph))
    expect(missing).toEqual([])
  })
})

describe('the first commands', () => {
  const top = README.slice(0, README.indexOf('\n## '))

  test('the job first, then the two commands: install and start with the demo; run the tests', () => {
    const commands = blocks(top).filter((b) => b.lang === 'sh')
    expect(commands.map((c) => c.body.trim().split('\n').length)).toEqual([1, 1])
    expect(commands[0].body).toContain('npm install && npm start')
    expect(commands[1].body).toContain('npm ci && npm test')
    expect(top.indexOf('Rodwave checks a rod')).toBeLessThan(top.indexOf('```'))
  })

  test('recommends the Node version Electron declares, and says what else works', () => {
    const lock = JSON.parse(readFileSync('package-lock.json', 'utf8'))
    const declared = /(\d+)\.(\d+)/.exec(lock.packages['node_modules/electron'].engines.node)!
    expect(top).toContain(`**Install and start the app with the demo part** (Node.js ${declared[1]}.${declared[2]} or later`)
    const supported = /(\d+\.\d+)/.exec(JSON.parse(readFileSync('package.json', 'utf8')).engines.node)![1]
    expect(top).toContain(`Node.js ${supported} or later also works`)
    expect(top).toContain('EBADENGINE')
  })

  test('the test command is the one CI runs', async () => {
    const command = blocks(top).filter((b) => b.lang === 'sh')[1].body.trim()
    const { stdout } = await promisify(execFile)('bash', ['.ci/run', '--print-test-command'])
    expect(stdout.trim()).toBe(command)
  })

  test('the test command uses sudo only where the shell is not root', async () => {
    const command = blocks(top).filter((b) => b.lang === 'sh')[1].body.trim()
    expect(command.startsWith('sudo ')).toBe(false)
    // Its first statement decides; run it as this user and see what it picks.
    const decide = command.slice(0, command.indexOf(';'))
    const { stdout } = await promisify(execFile)('sh', ['-c', `${decide}; printf '%s' "$SUDO"`])
    expect(stdout).toBe(process.getuid?.() === 0 ? '' : 'sudo')
  })
})
