/** Always on screen: what the numbers are and are not. */
export function CautionBanner() {
  return (
    <div className="caution" role="note" data-testid="caution">
      <strong>Caution:</strong> results are quasi-static estimates on rigid ground. Bounce, momentum, soft or crumbling
      ground, tyre pressure and driver input reduce the real margin. Keep well inside the limits shown, use a spotter, and
      follow the vehicle maker&apos;s limits, local regulations and trained practice.
    </div>
  );
}
