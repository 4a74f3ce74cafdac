import { useState } from 'react';
import { Section } from '@/components/ui/section';
import { formatNumber } from '@/lib/format';
import { useUploadAttachment } from '../api/upload-attachment';
import type { InspectionDetail, WorkshopOptions } from '../api/types';
import { inputCls } from './record-form-parts';

/** The inspection's photos and test-lane printouts; while it is open, a file can be attached. */
export function InspectionAttachments({ inspection, options, open }: { inspection: InspectionDetail; options: WorkshopOptions; open: boolean }) {
  const upload = useUploadAttachment(inspection.id);
  const [uploadKind, setUploadKind] = useState<'photo' | 'printout'>('photo');
  return (
    <Section title="Photos and test-lane printout" description={`JPEG, PNG or WebP photos; the printout as a PDF or an image; at most ${formatNumber(options.attachmentMaxBytes / 1024 / 1024)} MB each.`}>
      {open ? (
        <div className="flex flex-wrap items-end gap-3">
          <label className="text-sm font-medium">
            Kind
            <select className={inputCls} value={uploadKind} onChange={(e) => setUploadKind(e.target.value as 'photo' | 'printout')}>
              <option value="photo">Photo</option>
              <option value="printout">Test-lane printout</option>
            </select>
          </label>
          <label className="text-sm font-medium">
            File
            <input
              type="file"
              aria-label="Attach a file"
              accept="image/jpeg,image/png,image/webp,application/pdf"
              className="block min-h-11"
              onChange={(e) => {
                const f = e.target.files?.[0];
                if (f) upload.mutate({ file: f, kind: uploadKind });
                e.target.value = '';
              }}
            />
          </label>
          {upload.isPending ? <span className="text-sm text-slate">Uploading…</span> : null}
        </div>
      ) : null}
      {upload.error ? <p role="alert" className="mt-2 text-sm text-overdue">{(upload.error as Error).message}</p> : null}
      <ul className="mt-3 flex flex-wrap gap-3" aria-label="Attachments">
        {inspection.attachments.map((a) => (
          <li key={a.id} className="rounded border border-line p-2 text-sm">
            {a.mimeType.startsWith('image/') ? <img src={a.url} alt={`${a.kind}: ${a.originalName}`} className="mb-1 h-24 w-32 object-cover" /> : null}
            <a className="link" href={a.url} target="_blank" rel="noreferrer">
              {a.kind === 'photo' ? 'Photo' : 'Printout'}: {a.originalName}
            </a>{' '}
            <span className="tabular text-slate">({formatNumber(a.sizeBytes / 1024, 1)} kB)</span>
          </li>
        ))}
        {!inspection.attachments.length ? <li className="text-sm text-slate">Nothing attached yet.</li> : null}
      </ul>
    </Section>
  );
}
