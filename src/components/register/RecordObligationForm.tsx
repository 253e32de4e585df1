import { useRef, useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError } from '../../lib/queries/api-client';
import { Button, ErrorNote } from '../ui/parts';

interface TypeOption {
  id: string;
  name: string;
  criterion: { quantity: string; unit: string } | null;
}

/** Records an obligation done: date, who, measured values, remarks and an evidence file (multipart). */
export default function RecordObligationForm({ assetId, obligations }: { assetId: string; obligations: TypeOption[] }) {
  const client = useQueryClient();
  const formRef = useRef<HTMLFormElement>(null);
  const [typeId, setTypeId] = useState(obligations[0]?.id ?? '');
  const [done, setDone] = useState<string | null>(null);
  const type = obligations.find((o) => o.id === typeId);
  const record = useMutation({
    mutationFn: async (form: FormData) => {
      const res = await fetch(`/api/assets/${assetId}/records`, { method: 'POST', body: form });
      const body = await res.json();
      if (!res.ok) throw new ApiError(res.status, body.error, body.message, body.fields ?? []);
      return body as { result: string };
    },
    onSuccess: (r) => {
      setDone(`Recorded: ${r.result}.`);
      formRef.current?.reset();
      void client.invalidateQueries({ queryKey: ['register'] });
    },
  });
  const input = 'mt-1 block w-full rounded border border-rule bg-panel px-2 py-1';
  return (
    <form
      ref={formRef}
      aria-label="Record an obligation"
      className="mt-3 grid grid-cols-2 gap-3 rounded border border-rule p-3 text-sm md:grid-cols-3"
      onSubmit={(e) => {
        e.preventDefault();
        setDone(null);
        const form = new FormData(e.currentTarget);
        if (!(form.get('file') as File | null)?.size) form.delete('file');
        record.mutate(form);
      }}
    >
      <label>Obligation
        <select name="obligationTypeId" className={input} value={typeId} onChange={(e) => setTypeId(e.target.value)}>
          {obligations.map((o) => <option key={o.id} value={o.id}>{o.name}</option>)}
        </select>
      </label>
      <label>Done on (UTC date)<input name="doneOn" className={input} placeholder="YYYY-MM-DD" /></label>
      <label>Done by<input name="performedBy" className={input} /></label>
      {type?.criterion && <label>Measured {type.criterion.quantity} ({type.criterion.unit}), comma separated<input name="values" className={input} /></label>}
      <label>Evidence file<input name="file" type="file" className="mt-1 block text-sm" /></label>
      <label className="md:col-span-2">Remarks<input name="remarks" className={input} /></label>
      <div className="col-span-full flex items-center gap-3">
        <Button type="submit" disabled={record.isPending}>Record it</Button>
        {done && <span role="status" className="font-semibold text-pass">{done}</span>}
      </div>
      {record.error && <div className="col-span-full"><ErrorNote error={record.error} /></div>}
    </form>
  );
}
