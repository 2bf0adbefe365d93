/**
 * The IPC contract's types, the one place the window names them. Type-only: nothing of
 * electron/ reaches the bundle (the lint rule allows type imports only).
 */
export type { DocumentState, ExportKind, ExportRequest, ExportResult, MenuCommand, OpenResult, RecoveredWork, RodwaveBridge, SaveRequest, SaveResult } from '../../electron/ipc-contract'
