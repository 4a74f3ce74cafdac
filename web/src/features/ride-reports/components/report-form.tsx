import { useEffect, useRef, useState } from 'react';
import { Link } from 'react-router';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { LoadingState } from '@/components/ui/loading-state';
import { Notice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
import { formatDistance, formatNumber } from '@/lib/format';
import { cx } from '@/lib/class-names';
import { useRideScale } from '../api/get-ride-scale';
import { useSnapPosition, type SnapResult } from '../api/snap-position';
import { useCreateRideReport } from '../api/create-ride-report';
import { PlacePicker } from './place-picker';

const DRAFT_KEY = 'rb.ride-report-draft';
/** Photos up to this size are kept in the draft too (localStorage holds about 5 MB). */
const DRAFT_PHOTO_MAX_CHARS = 3_000_000;

interface Draft {
  point: { lat: number; lon: number } | null;
  positionSource: 'gps' | 'map';
  accuracyM: number | null;
  severity: number | null;
  felt: string[];
  note: string;
  reportedAt: string | null;
  photo: { name: string; dataUrl: string } | null;
}
const EMPTY: Draft = { point: null, positionSource: 'map', accuracyM: null, severity: null, felt: [], note: '', reportedAt: null, photo: null };

function loadDraft(): Draft {
  try {
    const raw = localStorage.getItem(DRAFT_KEY);
    return raw ? { ...EMPTY, ...(JSON.parse(raw) as Partial<Draft>) } : EMPTY;
  } catch {
    return EMPTY;
  }
}

function dataUrlToFile(d: { name: string; dataUrl: string }): File {
  const [head, b64] = d.dataUrl.split(',');
  const type = /data:([^;]+)/.exec(head)?.[1] ?? 'image/jpeg';
  const bin = atob(b64);
  const bytes = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  return new File([bytes], d.name, { type });
}

/** The driver's harsh-ride report: place, how bad, what was felt, a note and a photo. Keeps a draft on the phone. */
export function ReportForm({ myReportsPath }: { myReportsPath: string }) {
  const scale = useRideScale();
  const snap = useSnapPosition();
  // for a place far from every route: which route is nearest, on request
  const nearest = useSnapPosition();
  const create = useCreateRideReport();
  const [draft, setDraft] = useState<Draft>(loadDraft);
  const [photo, setPhoto] = useState<File | null>(() => (draft.photo ? dataUrlToFile(draft.photo) : null));
  const [photoNote, setPhotoNote] = useState<string | null>(null);
  const [snapped, setSnapped] = useState<SnapResult | null>(null);
  const [locating, setLocating] = useState(false);
  const [geoError, setGeoError] = useState<string | null>(null);
  const [sentId, setSentId] = useState<number | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const fileRef = useRef<HTMLInputElement>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const snapMutate = snap.mutate;
  const nearestReset = nearest.reset;

  useEffect(() => {
    try {
      localStorage.setItem(DRAFT_KEY, JSON.stringify(draft));
    } catch {
      /* storage full: the draft without the photo still matters most */
      try {
        localStorage.setItem(DRAFT_KEY, JSON.stringify({ ...draft, photo: null }));
      } catch {
        /* nothing more to do */
      }
    }
  }, [draft]);

  // Snap the chosen place to our roads whenever it changes (also for a restored draft).
  useEffect(() => {
    setSnapped(null);
    nearestReset();
    if (!draft.point) return;
    snapMutate(draft.point, { onSuccess: (r) => setSnapped(r) });
  }, [draft.point, snapMutate, nearestReset]);

  const update = (patch: Partial<Draft>) => {
    setDraft((d) => ({ ...d, ...patch, reportedAt: d.reportedAt ?? new Date().toISOString() }));
    // a new place answers "say where it was"; a new severity answers its own error
    if (patch.point || patch.severity != null) {
      setFieldErrors((e) => {
        const next = { ...e };
        if (patch.point) delete next.position;
        if (patch.severity != null) delete next.severity;
        return next;
      });
    }
  };

  function useMyPosition() {
    setGeoError(null);
    if (!('geolocation' in navigator)) {
      setGeoError('This phone does not share its position with the browser. Tap the road on the map instead.');
      return;
    }
    setLocating(true);
    navigator.geolocation.getCurrentPosition(
      (pos) => {
        setLocating(false);
        update({ point: { lat: pos.coords.latitude, lon: pos.coords.longitude }, positionSource: 'gps', accuracyM: pos.coords.accuracy, reportedAt: new Date().toISOString() });
      },
      (err) => {
        setLocating(false);
        setGeoError(err.code === err.PERMISSION_DENIED ? 'Position sharing is turned off for this site. Allow it in the browser, or tap the road on the map.' : 'Your position could not be found just now. Tap the road on the map instead.');
      },
      { enableHighAccuracy: true, timeout: 15_000, maximumAge: 30_000 },
    );
  }

  function pickPhoto(file: File | null) {
    setPhoto(file);
    setPhotoNote(null);
    if (!file) return update({ photo: null });
    const reader = new FileReader();
    reader.onload = () => {
      const dataUrl = String(reader.result);
      if (dataUrl.length <= DRAFT_PHOTO_MAX_CHARS) update({ photo: { name: file.name, dataUrl } });
      else {
        update({ photo: null });
        setPhotoNote('This photo is too big to keep in the draft; if sending fails, add it again.');
      }
    };
    reader.readAsDataURL(file);
  }

  function clear() {
    setDraft(EMPTY);
    setPhoto(null);
    setSnapped(null);
    setFieldErrors({});
    if (fileRef.current) fileRef.current.value = '';
    localStorage.removeItem(DRAFT_KEY);
  }

  function send() {
    const errors: Record<string, string> = {};
    if (!draft.point) errors.position = 'Say where it was: use your position or tap the road on the map.';
    if (!draft.severity) errors.severity = 'Choose how bad it was.';
    setFieldErrors(errors);
    if (Object.keys(errors).length) {
      // to the first thing to answer: the place, else how bad it was
      const first = errors.position ? formRef.current?.querySelector<HTMLElement>('[data-answers="position"]') : formRef.current?.querySelector<HTMLElement>('input[name="severity"]');
      first?.focus();
      return;
    }
    create.mutate(
      {
        input: { lat: draft.point!.lat, lon: draft.point!.lon, positionSource: draft.positionSource, accuracyM: draft.accuracyM, severity: draft.severity!, felt: draft.felt, note: draft.note, reportedAt: draft.reportedAt ?? new Date().toISOString() },
        photo,
      },
      {
        onSuccess: (r) => {
          setSentId(r.id);
          clear();
        },
        onError: (e) => setFieldErrors(isApiError(e) ? e.fields : {}),
      },
    );
  }

  if (scale.isPending) return <LoadingState label="Loading the form…" />;
  if (!scale.data) return <Notice tone="error">The report form could not be loaded. Check your connection and reload.</Notice>;

  if (sentId !== null) {
    return (
      <div className="flex flex-col gap-4">
        <Notice tone="ok" title="Report sent">
          Thank you. Your manager will look at it; you will see the outcome under My reports{' '}
          and get an e-mail if you have those turned on.
        </Notice>
        <Button variant="primary" size="lg" onClick={() => setSentId(null)}>
          Report another stretch
        </Button>
        <Link className="link text-center" to={myReportsPath}>
          See my reports
        </Link>
      </div>
    );
  }

  const hasDraft = draft.point !== null || draft.severity !== null || draft.note !== '' || draft.felt.length > 0;
  const snapError = snap.error && isApiError(snap.error) ? snap.error.message : snap.error ? 'The place could not be checked.' : null;
  const tooFar = !!snap.error && isApiError(snap.error) && snap.error.code === 'too_far';
  const near = tooFar ? nearest.data ?? null : null;

  return (
    <form
      ref={formRef}
      className="flex flex-col gap-6"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        send();
      }}
    >
      {hasDraft ? <p className="text-sm text-slate">Draft kept on this phone — it stays if the connection drops.</p> : null}

      <fieldset className="flex flex-col gap-3">
        <legend className="mb-2 text-base font-semibold text-ink">1. Where was it?</legend>
        <Button variant="secondary" size="lg" onClick={useMyPosition} busy={locating} data-answers="position" aria-describedby={fieldErrors.position ? 'position-error' : undefined}>
          {locating ? 'Finding your position…' : 'Use my position'}
        </Button>
        <p className="text-sm text-slate">…or tap the road on the map (only when parked).</p>
        <PlacePicker
          point={draft.point}
          snapped={snapped?.point ?? near?.point ?? null}
          highlightRouteId={near?.segment.routeId ?? null}
          onPick={(lat, lon) => update({ point: { lat, lon }, positionSource: 'map', accuracyM: null })}
        />
        <div aria-live="polite" className="text-sm">
          {geoError ? <p className="text-overdue">{geoError}</p> : null}
          {snap.isPending ? <p className="text-slate">Finding the nearest road…</p> : null}
          {snapped ? (
            <p data-testid="snap-result" className="rounded-md border border-line bg-surface p-2 text-ink">
              <strong>{snapped.segment.routeName}</strong>, segment {snapped.segment.seq + 1} ({formatNumber(snapped.segment.startM / 1000, 1)}–{formatNumber(snapped.segment.endM / 1000, 1)} km). Placed on the road{' '}
              {formatDistance(snapped.distanceM)} from {draft.positionSource === 'gps' ? 'your position' : 'where you tapped'}
              {draft.accuracyM !== null ? ` (position good to about ${formatDistance(draft.accuracyM)})` : ''}.
            </p>
          ) : null}
          {snapError ? <p className="text-overdue">{snapError}</p> : null}
          {tooFar && !near ? (
            <Button className="mt-2 w-full" busy={nearest.isPending} onClick={() => draft.point && nearest.mutate({ ...draft.point, nearest: true })}>
              Show the nearest route
            </Button>
          ) : null}
          {tooFar && nearest.error ? <p className="mt-2 text-overdue">The nearest route could not be found just now. Tap the road on the map instead.</p> : null}
          {near ? (
            <div data-testid="nearest-route" className="mt-2 flex flex-col gap-2 rounded-md border border-accent bg-surface p-2 text-ink">
              <p>
                The nearest route is <strong>{near.segment.routeName}</strong>, {formatDistance(near.distanceM)} away: it is outlined on the map, with its nearest point
                marked. If that is where it was, report it there; otherwise tap the road on the map.
              </p>
              <Button variant="secondary" onClick={() => update({ point: near.point, positionSource: 'map', accuracyM: null })}>
                Report it on {near.segment.routeName}
              </Button>
            </div>
          ) : null}
          {fieldErrors.position ? <p id="position-error" className="text-overdue">{fieldErrors.position}</p> : null}
        </div>
      </fieldset>

      <fieldset className="flex flex-col gap-2">
        <legend className="mb-2 text-base font-semibold text-ink">2. How bad was it?</legend>
        {scale.data.severities.map((s) => (
          <label
            key={s.level}
            className={cx(
              'flex min-h-14 cursor-pointer items-start gap-3 rounded-md border bg-surface p-3',
              draft.severity === s.level ? 'border-accent ring-2 ring-accent/40' : 'border-line-strong',
            )}
          >
            <input type="radio" name="severity" className="mt-1 size-5 accent-[#D9622B]" checked={draft.severity === s.level} onChange={() => update({ severity: s.level })} />
            <span>
              <span className="block font-semibold text-ink">{s.label}</span>
              <span className="block text-sm text-slate">{s.description}</span>
            </span>
          </label>
        ))}
        {fieldErrors.severity ? <p className="text-sm text-overdue">{fieldErrors.severity}</p> : null}
      </fieldset>

      <fieldset>
        <legend className="mb-2 text-base font-semibold text-ink">3. What did you feel?</legend>
        <div className="flex flex-wrap gap-2">
          {scale.data.felt.map((f) => {
            const on = draft.felt.includes(f.key);
            return (
              <label key={f.key} className={cx('flex min-h-11 cursor-pointer items-center gap-2 rounded-full border px-3 text-sm', on ? 'border-accent bg-accent/10 text-ink' : 'border-line-strong bg-surface text-ink')}>
                <input type="checkbox" className="size-4 accent-[#D9622B]" checked={on} onChange={() => update({ felt: on ? draft.felt.filter((k) => k !== f.key) : [...draft.felt, f.key] })} />
                {f.label}
              </label>
            );
          })}
        </div>
      </fieldset>

      <Field label="4. Anything else?" aside="(optional)" error={fieldErrors.note}>
        {(p) => <textarea {...p} rows={3} maxLength={1000} value={draft.note} onChange={(e) => update({ note: e.target.value })} className="w-full rounded-md border border-line-strong bg-surface p-3 text-[0.9375rem] text-ink" placeholder="e.g. deep hole on the left after the bridge" />}
      </Field>

      <Field label="5. Photo" aside="(optional, only when parked)" hint="JPEG, PNG or WebP, up to 8 MB." error={fieldErrors.photo}>
        {(p) => <input {...p} ref={fileRef} type="file" accept="image/jpeg,image/png,image/webp" capture="environment" onChange={(e) => pickPhoto(e.target.files?.[0] ?? null)} className="block w-full text-sm file:mr-3 file:h-11 file:rounded-md file:border file:border-line-strong file:bg-surface file:px-3" />}
      </Field>
      {photo ? <p className="-mt-4 text-sm text-slate">Photo chosen: {photo.name} ({photo.size < 1024 ? 'under 1' : formatNumber(photo.size / 1024, 0)} kB)</p> : null}
      {photoNote ? <p className="-mt-4 text-sm text-watch">{photoNote}</p> : null}

      {create.error ? (
        <Notice tone="error" title={isApiError(create.error) && create.error.status === 0 ? 'Not sent yet' : 'Not sent'}>
          {create.error.message}
        </Notice>
      ) : null}

      {/* Sits right on the phone's bottom menu (3.5rem and its 1px top line, app-shell.tsx); the two
          together stay under 120 px so the form keeps most of the screen. */}
      <div className="sticky bottom-[calc(3.5rem+1px+env(safe-area-inset-bottom))] z-[450] -mx-4 flex gap-2 border-t border-line bg-paper/95 px-4 py-1.5 backdrop-blur md:bottom-0 md:mx-0 md:py-3">
        <Button variant="quiet" onClick={clear} disabled={!hasDraft || create.isPending}>
          Clear
        </Button>
        <Button type="submit" variant="primary" className="flex-1" busy={create.isPending}>
          Send report
        </Button>
      </div>
    </form>
  );
}
