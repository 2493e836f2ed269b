/** A one-field search kept in the URL (`?q=`), submitted with the page's own address. */
export function TextSearch({ label, value }: { label: string; value: string | undefined }) {
  return (
    <form className="mb-4 flex items-end gap-2" role="search">
      <label className="flex flex-col text-sm">
        {label}
        <input name="q" defaultValue={value ?? ""} className="rounded border border-rule bg-white px-2 py-1.5" />
      </label>
      <button type="submit" className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
        Show
      </button>
    </form>
  );
}
