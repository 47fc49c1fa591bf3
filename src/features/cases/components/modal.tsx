// The modal dialog is shared UI now (src/components/ui/modal.tsx); kept here so this feature's imports stay put.
export { Modal } from "@/components/ui/modal";
