// Tapernote's own UI primitives. Import from "@/components/ui".
export { Alert, type AlertProps, type AlertTone } from "./Alert";
export {
  AnalysisBadge,
  Badge,
  RoleBadge,
  type AnalysisState,
  type BadgeProps,
  type BadgeTone,
  type StudioRole,
} from "./Badge";
export { Button, type ButtonProps, type ButtonSize, type ButtonVariant } from "./Button";
export { Card, type CardProps } from "./Card";
export { Cents, type CentsProps } from "./Cents";
export {
  FULL_SCALE_CENTS,
  IN_TUNE_CENTS,
  centsColour,
  centsCssColour,
  centsDirection,
  centsIntensity,
  describeCents,
  formatCents,
  roundCents,
  type CentsDirection,
} from "./cents-scale";
export { ConfirmDialog, type ConfirmDialogProps } from "./ConfirmDialog";
export { DeleteForGoodDialog, type DeleteForGoodDialogProps } from "./DeleteForGoodDialog";
export {
  DataTable,
  createDataTableColumns,
  dataTableFeatures,
  type DataTableColumn,
  type DataTableColumnMeta,
  type DataTableFeatures,
  type DataTableProps,
} from "./DataTable";
export { Dialog, type DialogProps } from "./Dialog";
export { EmptyState, type EmptyStateProps } from "./EmptyState";
export { Field, type FieldProps } from "./Field";
export { Input, type InputProps } from "./Input";
export { Mono } from "./Mono";
export { PageHeader, type PageHeaderProps } from "./PageHeader";
export { Select, type SelectProps } from "./Select";
export { Spinner, type SpinnerProps, type SpinnerSize } from "./Spinner";
export { Textarea, type TextareaProps } from "./Textarea";
export { cx } from "./cx";
export { PendingLinkHint } from "./PendingLinkHint";
