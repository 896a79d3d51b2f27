/**
 * One filter of a register's plain GET form: a labelled list whose first choice, `any`, sets no filter. The
 * choice in the URL is shown chosen; `numeric` lines numbers up as the register's columns do.
 */
export function FilterSelect({
  id,
  name,
  label,
  value,
  items,
  any = "Any",
  numeric = false,
}: {
  id: string;
  name: string;
  label: string;
  value: string | undefined;
  items: readonly { id: string; text: string }[];
  any?: string;
  numeric?: boolean;
}) {
  return (
    <div>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      <select id={id} name={name} className={numeric ? "field num" : "field"} defaultValue={value ?? ""}>
        <option value="">{any}</option>
        {items.map((i) => (
          <option key={i.id} value={i.id}>
            {i.text}
          </option>
        ))}
      </select>
    </div>
  );
}
