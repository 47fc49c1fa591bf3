import { useTranslation } from "react-i18next";
import { i18n } from "@/lib/i18n/i18n";
import { PhotoPicker } from "../photo-picker";

/** Step 4: photos, optional; they cannot be kept on this device with the other answers. */
export function PhotosStep({
  photos,
  onChange,
  disabled,
}: {
  photos: File[];
  onChange: (photos: File[]) => void;
  disabled: boolean;
}) {
  const { t } = useTranslation("report", { i18n });
  return (
    <div className="flex flex-col gap-4">
      <p>{t("photos.intro")}</p>
      <PhotoPicker value={photos} onChange={onChange} disabled={disabled} />
      <p className="text-sm text-ink-soft">{t("photos.notKept")}</p>
    </div>
  );
}
