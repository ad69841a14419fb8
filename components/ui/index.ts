// Halfmax UI primitives: no data, no fetch. Files marked "use client" keep their boundary through this barrel.
// Not re-exported: ./fonts (import `sans` from "@/components/ui/fonts" in the root layout only).
export { cn, type ClassValue } from "./cn";
export { Button, buttonClasses, type ButtonProps, type ButtonSize, type ButtonVariant } from "./button";
export { Input, controlClasses, type InputProps, type ControlSize } from "./input";
export { Textarea, type TextareaProps } from "./textarea";
export { Select, type SelectProps } from "./select";
export { Field, type FieldProps, type FieldControlProps } from "./field";
export { Card, CardHeader, CardTitle, CardDescription, CardBody, CardFooter, type CardProps, type CardHeaderProps, type CardTitleProps, type CardBodyProps } from "./card";
export { Dialog, type DialogProps } from "./dialog";
export { FormDialog, type FormDialogProps } from "./form-dialog";
export { Table, THead, TBody, Tr, Th, Td, SortIndicator, type SortDirection, type TableProps, type TrProps, type ThProps, type TdProps } from "./table-shell";
export { DataTable, type DataTableProps } from "./data-table";
export { StatusBadge, StatusIcon, STATUS_LABELS, type Status, type StatusBadgeProps } from "./status-badge";
export { EmptyState, type EmptyStateProps } from "./empty-state";
export { Spinner, type SpinnerProps } from "./spinner";
export { Skeleton, SkeletonText, type SkeletonProps, type SkeletonTextProps } from "./skeleton";
export { Callout, ClinicalCaution, CLINICAL_CAUTION_TEXT, type CalloutProps, type CalloutTone } from "./callout";
export { PageHeader, type PageHeaderProps } from "./page-header";
export { Metric, formatMetric, type MetricProps } from "./metric";
export { Tabs, TabList, Tab, TabPanel, type TabsProps, type TabListProps, type TabProps, type TabPanelProps } from "./tabs";
