interface Props {
  values: Record<string, string | undefined>;
  vocabulary: { entities: string[]; actions: string[] };
}

/** Filters as a plain GET form, so every filtered view has its own address. */
export function AuditFilters({ values, vocabulary }: Props) {
  return (
    <form method="get" className="grid gap-3 px-4 py-3 sm:grid-cols-6" role="search">
      <div>
        <label className="label" htmlFor="a-actor">Actor</label>
        <input id="a-actor" name="actor" className="field" defaultValue={values.actor} placeholder="Name, e-mail or system" />
      </div>
      <div>
        <label className="label" htmlFor="a-entity">Entity</label>
        <select id="a-entity" name="entity" className="field" defaultValue={values.entity ?? ""}>
          <option value="">Any</option>
          {vocabulary.entities.map((e) => <option key={e}>{e}</option>)}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="a-action">Action</label>
        <select id="a-action" name="action" className="field" defaultValue={values.action ?? ""}>
          <option value="">Any</option>
          {vocabulary.actions.map((a) => <option key={a}>{a}</option>)}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="a-from">From (UTC day)</label>
        <input id="a-from" name="from" type="date" className="field" defaultValue={values.from} />
      </div>
      <div>
        <label className="label" htmlFor="a-to">To (UTC day)</label>
        <input id="a-to" name="to" type="date" className="field" defaultValue={values.to} />
      </div>
      <div className="flex items-end gap-2">
        <button className="btn-primary">Filter</button>
        <a className="btn-quiet" href="/audit">Clear</a>
      </div>
    </form>
  );
}
