/** Messages between the window and the solver worker. */
import type { ConvergenceStudy, Project, TuneRequest, TuneResult } from '../../core/index'
import type { ProjectReadResult } from '../../core/model/project-schema'
import type { MassComparison, ProjectSource, ReportTaskInput, SolveOutcome } from './solver-tasks'
import type { FamilyKey } from '../../core/model/families'
import type { ResponseResult, ResponseTaskRequest, ScatterShare, ScatterShareRun, SensitivityTable } from './design-tasks'

export type SolverRequest =
  | { readonly id: number; readonly kind: 'solve'; readonly project: Project }
  | { readonly id: number; readonly kind: 'compare-masses'; readonly project: Project; readonly family?: FamilyKey }
  | { readonly id: number; readonly kind: 'converge'; readonly project: Project; readonly family?: FamilyKey }
  | { readonly id: number; readonly kind: 'report'; readonly input: ReportTaskInput }
  | { readonly id: number; readonly kind: 'sensitivities'; readonly project: Project }
  | { readonly id: number; readonly kind: 'tune'; readonly project: Project; readonly request: TuneRequest }
  | { readonly id: number; readonly kind: 'scatter-share'; readonly project: Project; readonly run: ScatterShareRun }
  | { readonly id: number; readonly kind: 'response'; readonly project: Project; readonly request: ResponseTaskRequest }
  | { readonly id: number; readonly kind: 'read-project'; readonly source: ProjectSource }

export interface SolverResults {
  solve: SolveOutcome
  'compare-masses': MassComparison
  converge: ConvergenceStudy
  report: string
  sensitivities: SensitivityTable
  tune: TuneResult
  'scatter-share': ScatterShare
  response: ResponseResult
  'read-project': ProjectReadResult
}

export type SolverResponse =
  | { readonly id: number; readonly type: 'done'; readonly result: SolverResults[keyof SolverResults] }
  | { readonly id: number; readonly type: 'progress'; readonly fraction: number }
  | { readonly id: number; readonly type: 'failed'; readonly message: string }
