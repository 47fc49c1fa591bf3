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
  return (
    <div className="flex flex-col gap-4">
      <p>
        Photos help your landlord see what you see. If you can, take one close up and one from further back, in daylight. Photos
        are optional.
      </p>
      <PhotoPicker value={photos} onChange={onChange} disabled={disabled} />
      <p className="text-sm text-ink-soft">
        Your other answers are kept on this device as you go, but photos can't be. If you leave before sending, you'll need to add
        them again.
      </p>
    </div>
  );
}
