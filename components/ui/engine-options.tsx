/** The engine layout choices, shared by the new-job form and the analysis settings. */
export function LayoutOptions() {
  return (
    <>
      <option value="inline">Inline</option>
      <option value="v">V</option>
      <option value="flat">Flat</option>
    </>
  );
}
