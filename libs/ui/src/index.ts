// The public face of @tappet/ui. The app also imports libs/ui/src/theme.css for the tokens.
export { cn } from './cn';
export * from './icons';
export { Button, buttonClasses, type ButtonProps, type ButtonSize, type ButtonVariant } from './button';
export { Spinner } from './spinner';
export { LoadingState, EmptyState, ErrorState, type EmptyStateProps, type ErrorStateProps } from './states';
export {
  FormField,
  FormMessage,
  TextField,
  PasswordField,
  Select,
  inputClasses,
  type FieldControlProps,
  type FormFieldProps,
  type TextFieldProps,
  type PasswordFieldProps,
  type SelectProps,
  type SelectOption,
} from './form-field';
export { DataTable, createColumnHelper, type DataTableProps, type ColumnDef, type SortingState } from './data-table';
export { Panel, type PanelProps } from './panel';
export { Dialog, ConfirmDialog, FormDialogFooter, type DialogProps, type ConfirmDialogProps, type FormDialogFooterProps } from './dialog';
export { ToastProvider, useToast, type Toast, type ToastTone } from './toast';
export { Badge, StatusPill, statusWords, type BadgeTone, type Status } from './badge';
export { Caution, type CautionProps } from './caution';
export { PartNumber, Num } from './part-number';
export { MenuButton, type MenuButtonProps, type MenuItem } from './menu-button';
export { PageNav, type PageNavProps } from './page-nav';
export { useTheme, applyStoredTheme, type ThemeChoice } from './theme';
export { ThemeMenu } from './theme-menu';
export {
  CameraScanButton,
  CameraScanDialog,
  cameraProblemMessages,
  cameraProblemOf,
  type CameraProblem,
  type CameraScanButtonProps,
  type CameraScanDialogProps,
} from './camera-scanner';
export { scanFormats, type ScanFormat } from './barcode-engine';
