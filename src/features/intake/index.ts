export { intakeKeys } from './keys';
export {
  uploadsQuery,
  useUploads,
  useUpload,
  useColumnMapping,
  useSaveColumnMapping,
  useRetryUpload,
  useAnswerAndRetry,
  intakeAnswersQuery,
  uploadPreviewQuery,
  useReplaceDecision,
  useRemoveUpload,
  useSendFiles,
  POLL_MS,
  PARALLEL_SENDS,
} from './api';
export type { Outgoing } from './api';
export { sendFile, resetUploadToken } from './send';
export { DropZone } from './components/DropZone';
export { OutgoingList } from './components/OutgoingList';
export { UploadHistory } from './components/UploadHistory';
export { UploadFollow } from './components/UploadFollow';
export { ColumnMappingStep } from './components/ColumnMappingStep';
export { AnswersStep } from './components/AnswersStep';
export { FileProblems, problemPlace } from './components/FileProblems';
export {
  uploadSchema,
  uploadListSchema,
  fileProblemSchema,
  columnMappingSchema,
  COLUMN_ROLES,
  COLUMN_ROLE_LABELS,
  isActive,
  needsAnswers,
} from './types';
export type { Upload, UploadStatus, FileProblem, ColumnRole, ColumnMapping, IntakeAnswers, FileNeed } from './types';
