import { type MouseEvent, useId } from 'react';

interface SitePlanPinProps {
  imageUrl: string;
  /** Pin position as fractions of the image width and height (0–1), or null when not placed. */
  x: number | null;
  y: number | null;
  /** Omit to show the pin read-only. */
  onPick?: (x: number, y: number) => void;
}

const round4 = (v: number) => Math.round(Math.min(1, Math.max(0, v)) * 10_000) / 10_000;

/** The uploaded site plan with the pit's pin; a click (or tap) on the image moves the pin there. */
export function SitePlanPin({ imageUrl, x, y, onPick }: SitePlanPinProps) {
  const helpId = useId();
  const image = <img src={imageUrl} alt="Site plan" className="block h-auto w-full" draggable={false} />;
  const pin = x != null && y != null && (
    <span
      aria-hidden="true"
      className="pointer-events-none absolute size-7 -translate-x-1/2 -translate-y-1/2 rounded-full border-4 border-white bg-neutral-950 shadow-[0_0_0_3px_#0a0a0a]"
      style={{ left: `${x * 100}%`, top: `${y * 100}%` }}
    />
  );
  const caption = x != null && y != null ? `Pin at ${(x * 100).toFixed(1)} % across, ${(y * 100).toFixed(1)} % down.` : 'No pin placed yet.';

  if (!onPick) {
    return (
      <figure className="max-w-2xl">
        <div className="relative overflow-hidden rounded-md border-2 border-neutral-300">
          {image}
          {pin}
        </div>
        <figcaption className="mt-1 text-neutral-800">{caption}</figcaption>
      </figure>
    );
  }

  const place = (event: MouseEvent<HTMLButtonElement>) => {
    if (event.detail === 0) return; // keyboard activation has no position; the number fields serve keyboards
    const box = event.currentTarget.getBoundingClientRect();
    onPick(round4((event.clientX - box.left) / box.width), round4((event.clientY - box.top) / box.height));
  };

  return (
    <figure className="max-w-2xl">
      <button
        type="button"
        onClick={place}
        className="relative block w-full cursor-crosshair overflow-hidden rounded-md border-2 border-neutral-700"
        aria-describedby={helpId}
      >
        {image}
        {pin}
      </button>
      <figcaption id={helpId} className="mt-1 text-neutral-800">
        Tap the plan where the pit is. {caption}
      </figcaption>
    </figure>
  );
}
