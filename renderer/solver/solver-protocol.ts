/** Messages between the window and the solver worker. */
import type { ConvergenceStudy, Project } from '../../core/index'
import type { MassComparison, ReportTaskInput, SolvedModel } from './solver-tasks'

export type SolverRequest =
  | { readonly id: number; readonly kind: 'solve'; readonly project: Project }
  | { readonly id: number; readonly kind: 'compare-masses'; readonly project: Project }
  | { readonly id: number; readonly kind: 'converge'; readonly project: Project }
  | { readonly id: number; readonly kind: 'report'; readonly input: ReportTaskInput }

export interface SolverResults {
  solve: SolvedModel
  'compare-masses': MassComparison
  converge: ConvergenceStudy
  report: string
}

export type SolverResponse =
  | { readonly id: number; readonly type: 'done'; readonly result: SolverResults[keyof SolverResults] }
  | { readonly id: number; readonly type: 'progress'; readonly fraction: number }
  | { readonly id: number; readonly type: 'failed'; readonly message: string }
