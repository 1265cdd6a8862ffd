import { useEffect, useMemo, useRef, useState } from 'react';
import { useFieldArray, useForm, type UseFormRegister } from 'react-hook-form';
import type { DraftView, MetadataProblem } from '../../../../shared/contracts';
import { licenceOptions, validateMetadata } from '../../../../shared/metadata/validate-metadata';
import { Button } from '../../../components/button';
import { FormAlert, SelectField, TextArea, TextField } from '../../../components/form';
import { Badge } from '../../../components/badge';
import { errorMessage } from '../../../components/query-state';
import { useSaveMetadata } from '../api/save-metadata';

/** The form's own shape: every input is a string; `toMetadata` turns it into the JSON document. */
type Person = { name: string; orcid: string; affiliationName: string; rorId: string };
type FormValues = {
  title: string;
  description: string;
  creators: Person[];
  contactName: string;
  contactEmail: string;
  keywords: string;
  species: Array<{ name: string; commonName: string; taxonId: string }>;
  groupType: string;
  setting: string;
  sitePlace: string;
  latitude: string;
  longitude: string;
  recordingStart: string;
  recordingEnd: string;
  numberOfIndividuals: string;
  dimension: string;
  units: string;
  pixelSize: string;
  frameRate: string;
  gravityAxis: string;
  cameraCount: string;
  cameraModel: string;
  calibration: string;
  trackingMethod: string;
  trackingSoftware: string;
  trackingParameters: string;
  temperatureC: string;
  light: string;
  licence: string;
  funding: Array<{ funder: string; awardNumber: string }>;
  related: Array<{ identifier: string; relationType: string }>;
  accessLevel: string;
  embargoUntil: string;
  changelog: string;
};

const s = (v: unknown) => (v === undefined || v === null ? '' : String(v));
const num = (v: string) => (v.trim() === '' ? undefined : Number(v.replace(',', '.')));
const text = (v: string) => (v.trim() === '' ? undefined : v.trim());
/** Drops empty strings, empty objects and empty arrays so the document only says what was filled. */
function prune<T>(v: T): T | undefined {
  if (Array.isArray(v)) {
    const a = v.map(prune).filter((x) => x !== undefined);
    return (a.length ? a : undefined) as T | undefined;
  }
  if (v && typeof v === 'object') {
    const o = Object.fromEntries(Object.entries(v).map(([k, x]) => [k, prune(x)]).filter(([, x]) => x !== undefined));
    return (Object.keys(o).length ? o : undefined) as T | undefined;
  }
  return v === '' || v === undefined || (typeof v === 'number' && Number.isNaN(v)) ? undefined : v;
}

export function toMetadata(f: FormValues): Record<string, unknown> {
  return (
    prune({
      schemaVersion: '1.0.0',
      title: text(f.title),
      description: text(f.description),
      creators: f.creators.map((c) => ({ name: text(c.name), orcid: text(c.orcid), affiliation: { name: text(c.affiliationName), rorId: text(c.rorId) } })),
      contact: { name: text(f.contactName), email: text(f.contactEmail) },
      keywords: f.keywords.split(',').map((k) => k.trim()).filter(Boolean),
      species: f.species.map((x) => ({ name: text(x.name), commonName: text(x.commonName), taxonId: text(x.taxonId) })),
      groupType: text(f.groupType),
      setting: text(f.setting),
      site: { place: text(f.sitePlace), latitude: num(f.latitude), longitude: num(f.longitude) },
      recordingDates: { start: text(f.recordingStart), end: text(f.recordingEnd) },
      numberOfIndividuals: num(f.numberOfIndividuals),
      dimension: num(f.dimension),
      units: text(f.units),
      pixelSize: num(f.pixelSize),
      frameRate: num(f.frameRate),
      gravityAxis: text(f.gravityAxis),
      cameras: { count: num(f.cameraCount), model: text(f.cameraModel), calibration: text(f.calibration) },
      tracking: { method: text(f.trackingMethod), software: text(f.trackingSoftware), parameters: text(f.trackingParameters) },
      environment: { temperatureC: num(f.temperatureC), light: text(f.light) },
      licence: text(f.licence),
      funding: f.funding.map((x) => ({ funder: text(x.funder), awardNumber: text(x.awardNumber) })),
      relatedIdentifiers: f.related.map((x) => ({ identifier: text(x.identifier), relationType: text(x.relationType) })),
      access: { level: text(f.accessLevel), embargoUntil: f.accessLevel === 'embargoed' ? text(f.embargoUntil) : undefined },
    }) ?? {}
  );
}

function toForm(m: any, changelog: string): FormValues {
  return {
    title: s(m.title),
    description: s(m.description),
    creators: (m.creators?.length ? m.creators : [{}]).map((c: any) => ({ name: s(c.name), orcid: s(c.orcid), affiliationName: s(c.affiliation?.name), rorId: s(c.affiliation?.rorId) })),
    contactName: s(m.contact?.name),
    contactEmail: s(m.contact?.email),
    keywords: (m.keywords ?? []).join(', '),
    species: (m.species?.length ? m.species : [{}]).map((x: any) => ({ name: s(x.name), commonName: s(x.commonName), taxonId: s(x.taxonId) })),
    groupType: s(m.groupType),
    setting: s(m.setting),
    sitePlace: s(m.site?.place),
    latitude: s(m.site?.latitude),
    longitude: s(m.site?.longitude),
    recordingStart: s(m.recordingDates?.start),
    recordingEnd: s(m.recordingDates?.end),
    numberOfIndividuals: s(m.numberOfIndividuals),
    dimension: s(m.dimension),
    units: s(m.units),
    pixelSize: s(m.pixelSize),
    frameRate: s(m.frameRate),
    gravityAxis: s(m.gravityAxis),
    cameraCount: s(m.cameras?.count),
    cameraModel: s(m.cameras?.model),
    calibration: s(m.cameras?.calibration),
    trackingMethod: s(m.tracking?.method),
    trackingSoftware: s(m.tracking?.software),
    trackingParameters: s(m.tracking?.parameters),
    temperatureC: s(m.environment?.temperatureC),
    light: s(m.environment?.light),
    licence: s(m.licence),
    funding: (m.funding ?? []).map((x: any) => ({ funder: s(x.funder), awardNumber: s(x.awardNumber) })),
    related: (m.relatedIdentifiers ?? []).map((x: any) => ({ identifier: s(x.identifier), relationType: s(x.relationType) })),
    accessLevel: s(m.access?.level) || 'open',
    embargoUntil: s(m.access?.embargoUntil),
    changelog,
  };
}

/** Values the engine measured in the files, to pre-fill and cross-check the form. */
export function measuredFromFiles(draft: DraftView) {
  const ready = draft.files.filter((f) => f.state === 'ready' && f.summary);
  if (!ready.length) return null;
  const sums = ready.map((f) => f.summary as { tracks?: number; individualsPerFrame?: { max?: number } });
  const one = <T,>(values: T[]) => (new Set(values).size === 1 ? values[0] : null);
  return {
    numberOfIndividuals: Math.max(...sums.map((x) => x.individualsPerFrame?.max ?? x.tracks ?? 0)),
    // Only when every file agrees.
    frameRate: one(ready.map((f) => f.measured?.fps ?? null)),
    dimension: one(ready.map((f) => f.measured?.dims ?? null)),
  };
}

const backupKey = (draftId: string) => `cohesia:metadata-backup:${draftId}`;

export function MetadataForm({ slug, draft, editable, showAllProblems }: { slug: string; draft: DraftView; editable: boolean; showAllProblems: boolean }) {
  const backup = useMemo(() => {
    try {
      return JSON.parse(localStorage.getItem(backupKey(draft.id)) ?? 'null') as FormValues | null;
    } catch {
      return null;
    }
  }, [draft.id]);
  const form = useForm<FormValues>({ defaultValues: backup ?? toForm(draft.metadata, draft.changelog) });
  const { register, control, watch, formState } = form;
  const creators = useFieldArray({ control, name: 'creators' });
  const species = useFieldArray({ control, name: 'species' });
  const funding = useFieldArray({ control, name: 'funding' });
  const related = useFieldArray({ control, name: 'related' });
  const save = useSaveMetadata(slug, draft.id);
  const [problems, setProblems] = useState<MetadataProblem[]>(() => validateMetadata(backup ? toMetadata(backup) : draft.metadata));
  const [status, setStatus] = useState<{ tone: 'info' | 'error' | 'success'; text: string } | null>(backup ? { tone: 'info', text: 'Restored changes that had not been saved yet; they are being saved now.' } : null);
  const timer = useRef<ReturnType<typeof setTimeout>>(undefined);

  const persist = (values: FormValues) => {
    const metadata = toMetadata(values);
    setProblems(validateMetadata(metadata));
    save.mutate(
      { metadata, changelog: values.changelog },
      {
        onSuccess: (r) => {
          localStorage.removeItem(backupKey(draft.id));
          setProblems(r.problems);
          setStatus({ tone: 'success', text: `All changes saved at ${new Date(r.savedAt).toLocaleTimeString('en-GB')}.` });
        },
        onError: (e) => setStatus({ tone: 'error', text: `Not saved yet (${errorMessage(e)}). Your text stays here and on this computer; we try again with your next change.` }),
      },
    );
  };

  // Autosave: a second after the last keystroke; a copy stays in this browser until the server has it.
  useEffect(() => {
    if (!editable) return;
    if (backup) persist(form.getValues());
    const sub = watch((values) => {
      localStorage.setItem(backupKey(draft.id), JSON.stringify(values));
      setStatus({ tone: 'info', text: 'Saving…' });
      clearTimeout(timer.current);
      timer.current = setTimeout(() => persist(form.getValues()), 1000);
    });
    return () => {
      sub.unsubscribe();
      clearTimeout(timer.current);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [editable, draft.id]);

  const pathOf = (name: string) => {
    const map: Record<string, string> = {
      contactName: '/contact/name', contactEmail: '/contact/email', sitePlace: '/site/place', latitude: '/site/latitude', longitude: '/site/longitude',
      recordingStart: '/recordingDates/start', recordingEnd: '/recordingDates/end', cameraCount: '/cameras/count', cameraModel: '/cameras/model',
      calibration: '/cameras/calibration', trackingMethod: '/tracking/method', trackingSoftware: '/tracking/software', trackingParameters: '/tracking/parameters',
      temperatureC: '/environment/temperatureC', light: '/environment/light', accessLevel: '/access/level', embargoUntil: '/access/embargoUntil',
    };
    if (map[name]) return map[name];
    const m = /^(creators|species|funding|related)\.(\d+)\.(\w+)$/.exec(name);
    if (m) {
      const list = m[1] === 'related' ? 'relatedIdentifiers' : m[1];
      const field = m[3] === 'affiliationName' ? 'affiliation/name' : m[3] === 'rorId' ? 'affiliation/rorId' : m[3];
      return `/${list}/${m[2]}/${field}`;
    }
    return `/${name}`;
  };
  const touched = (name: string) => {
    const parts = name.split('.');
    let t: any = formState.touchedFields;
    for (const p of parts) t = t?.[p];
    return !!t;
  };
  const err = (name: string) => (showAllProblems || touched(name) ? problems.find((p) => p.path === pathOf(name))?.message : undefined);
  const f = (name: any, label: string, props: Record<string, unknown> = {}) => (
    <TextField label={label} error={err(name)} disabled={!editable} {...props} {...register(name)} />
  );

  const measured = measuredFromFiles(draft);
  const individuals = watch('numberOfIndividuals');
  // Pre-fill what the engine measured where the depositor has not said anything yet.
  const measuredKey = JSON.stringify(measured);
  useEffect(() => {
    if (!editable || !measured) return;
    const fill = { numberOfIndividuals: measured.numberOfIndividuals || null, frameRate: measured.frameRate, dimension: measured.dimension };
    for (const [name, value] of Object.entries(fill) as Array<['numberOfIndividuals' | 'frameRate' | 'dimension', number | null]>) {
      if (value && form.getValues(name) === '') form.setValue(name, String(value), { shouldDirty: true });
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [measuredKey, editable]);
  const disagrees = measured && individuals !== '' && Number(individuals) !== measured.numberOfIndividuals;

  return (
    <form className="flex flex-col gap-6" onSubmit={(e) => e.preventDefault()} noValidate aria-label="Dataset metadata">
      <div className="sticky top-0 z-10 -mx-1 flex flex-wrap items-center gap-3 bg-paper/95 px-1 py-2">
        {problems.length ? (
          <Badge tone="ember" icon="⚠">{problems.length} {problems.length === 1 ? 'field needs' : 'fields need'} attention</Badge>
        ) : (
          <Badge tone="reed" icon="✓">Metadata complete</Badge>
        )}
        {status ? <span role="status" className={`text-sm ${status.tone === 'error' ? 'text-[#8a4418]' : 'text-ink/70'}`}>{status.text}</span> : null}
      </div>

      <Fieldset legend="About the dataset">
        {f('title', 'Title')}
        <TextArea label="Description" error={err('description')} disabled={!editable} hint="What was recorded, how, and what the files contain." {...register('description')} />
        {f('keywords', 'Keywords', { hint: 'Separated by commas.' })}
      </Fieldset>

      <Fieldset legend="Creators">
        {creators.fields.map((c, i) => (
          <div key={c.id} className="grid gap-3 rounded-md border border-mist bg-white p-3 sm:grid-cols-2">
            {f(`creators.${i}.name`, 'Name')}
            {f(`creators.${i}.orcid`, 'ORCID iD', { placeholder: '0000-0002-1825-0097' })}
            {f(`creators.${i}.affiliationName`, 'Affiliation')}
            {f(`creators.${i}.rorId`, 'ROR id of the affiliation', { placeholder: 'https://ror.org/05dxps055' })}
            {editable && creators.fields.length > 1 ? (
              <div><Button variant="quiet" type="button" onClick={() => creators.remove(i)}>Remove this creator</Button></div>
            ) : null}
          </div>
        ))}
        {editable ? <div><Button type="button" variant="secondary" onClick={() => creators.append({ name: '', orcid: '', affiliationName: '', rorId: '' })}>Add a creator</Button></div> : null}
        <div className="grid gap-3 sm:grid-cols-2">
          {f('contactName', 'Contact person')}
          {f('contactEmail', 'Contact e-mail', { type: 'email' })}
        </div>
      </Fieldset>

      <Fieldset legend="Animals and setting">
        {species.fields.map((x, i) => (
          <div key={x.id} className="grid gap-3 sm:grid-cols-3">
            {f(`species.${i}.name`, 'Scientific name', { placeholder: 'Culex pipiens' })}
            {f(`species.${i}.commonName`, 'Common name')}
            {f(`species.${i}.taxonId`, 'Taxon id', { placeholder: 'NCBITaxon:7175' })}
          </div>
        ))}
        {editable ? <div><Button type="button" variant="secondary" onClick={() => species.append({ name: '', commonName: '', taxonId: '' })}>Add a species</Button></div> : null}
        <div className="grid gap-3 sm:grid-cols-3">
          <Select register={register} name="groupType" label="Group type" error={err('groupType')} disabled={!editable} options={['swarm', 'school', 'flock', 'herd', 'colony', 'other']} />
          <Select register={register} name="setting" label="Setting" error={err('setting')} disabled={!editable} options={['laboratory', 'field']} />
          <div className="flex flex-col gap-1">
            {f('numberOfIndividuals', 'Number of individuals', { inputMode: 'numeric' })}
            {disagrees ? <Badge tone="ember" icon="≠">The files show {measured!.numberOfIndividuals}</Badge> : null}
          </div>
        </div>
        <div className="grid gap-3 sm:grid-cols-3">
          {f('sitePlace', 'Place')}
          {f('latitude', 'Latitude (°)', { inputMode: 'decimal' })}
          {f('longitude', 'Longitude (°)', { inputMode: 'decimal' })}
          {f('recordingStart', 'First recording day', { type: 'date' })}
          {f('recordingEnd', 'Last recording day', { type: 'date' })}
        </div>
      </Fieldset>

      <Fieldset legend="Recording and tracking">
        <div className="grid gap-3 sm:grid-cols-3">
          <div className="flex flex-col gap-1">
            <Select register={register} name="dimension" label="Dimension" error={err('dimension')} disabled={!editable} options={['2', '3']} labels={{ '2': '2D', '3': '3D' }} />
            {measured?.dimension && watch('dimension') !== '' && Number(watch('dimension')) !== measured.dimension ? (
              <Badge tone="ember" icon="≠">The files are {measured.dimension}D</Badge>
            ) : null}
          </div>
          <Select register={register} name="units" label="Length unit of positions" error={err('units')} disabled={!editable} options={['m', 'cm', 'mm', 'px']} />
          {watch('units') === 'px' ? f('pixelSize', 'Size of one pixel (m)', { inputMode: 'decimal' }) : null}
          <div className="flex flex-col gap-1">
            {f('frameRate', 'Frame rate (frames/s)', { inputMode: 'decimal' })}
            {measured?.frameRate && watch('frameRate') !== '' && Number(watch('frameRate')) !== measured.frameRate ? (
              <Badge tone="ember" icon="≠">The files were read at {measured.frameRate} frames/s</Badge>
            ) : null}
          </div>
          <Select register={register} name="gravityAxis" label="Axis pointing up" error={err('gravityAxis')} disabled={!editable} options={['x', 'y', 'z', '-x', '-y', '-z', 'none']} />
          {f('cameraCount', 'Number of cameras', { inputMode: 'numeric' })}
          {f('cameraModel', 'Camera model')}
        </div>
        <TextArea label="Calibration" error={err('calibration')} disabled={!editable} {...register('calibration')} />
        <div className="grid gap-3 sm:grid-cols-2">
          {f('trackingMethod', 'Tracking method')}
          {f('trackingSoftware', 'Software and version')}
        </div>
        <TextArea label="Tracking parameters" error={err('trackingParameters')} disabled={!editable} {...register('trackingParameters')} />
        <div className="grid gap-3 sm:grid-cols-2">
          {f('temperatureC', 'Temperature (°C)', { inputMode: 'decimal' })}
          {f('light', 'Light conditions')}
        </div>
      </Fieldset>

      <Fieldset legend="Licence, access and credit">
        <TextField label="Licence (SPDX identifier)" list="spdx-licences" hint="For example CC-BY-4.0 or CC0-1.0." error={err('licence')} disabled={!editable} {...register('licence')} />
        <datalist id="spdx-licences">
          {licenceOptions.map((l) => (
            <option key={l.id} value={l.id}>{l.name}</option>
          ))}
        </datalist>
        <div className="grid gap-3 sm:grid-cols-2">
          <Select register={register} name="accessLevel" label="Access" error={err('accessLevel')} disabled={!editable} options={['open', 'restricted', 'embargoed']} labels={{ open: 'Open: anyone may download', restricted: 'Restricted: on request', embargoed: 'Embargoed until a date' }} />
          {watch('accessLevel') === 'embargoed' ? f('embargoUntil', 'Embargo ends on', { type: 'date' }) : null}
        </div>
        {funding.fields.map((x, i) => (
          <div key={x.id} className="grid gap-3 sm:grid-cols-2">
            {f(`funding.${i}.funder`, 'Funder')}
            {f(`funding.${i}.awardNumber`, 'Award number')}
          </div>
        ))}
        {editable ? <div><Button type="button" variant="secondary" onClick={() => funding.append({ funder: '', awardNumber: '' })}>Add funding</Button></div> : null}
        {related.fields.map((x, i) => (
          <div key={x.id} className="grid gap-3 sm:grid-cols-2">
            {f(`related.${i}.identifier`, 'Related DOI', { placeholder: '10.1234/abcd' })}
            <Select register={register} name={`related.${i}.relationType`} label="Relation" error={err(`related.${i}.relationType`)} disabled={!editable}
              options={['IsSupplementTo', 'IsCitedBy', 'IsDocumentedBy', 'IsDescribedBy', 'References', 'IsDerivedFrom', 'IsSourceOf', 'IsPartOf']} />
          </div>
        ))}
        {editable ? <div><Button type="button" variant="secondary" onClick={() => related.append({ identifier: '', relationType: 'IsSupplementTo' })}>Add a related paper or dataset</Button></div> : null}
        {draft.baseVersion ? <TextArea label={`What changed since version ${draft.baseVersion}`} disabled={!editable} {...register('changelog')} /> : null}
      </Fieldset>
      {showAllProblems && problems.length ? (
        <FormAlert>
          <p className="font-medium">Before submitting:</p>
          <ul className="list-disc pl-5">
            {problems.map((p) => (
              <li key={p.path + p.message}>{p.message}</li>
            ))}
          </ul>
        </FormAlert>
      ) : null}
    </form>
  );
}

function Fieldset({ legend, children }: { legend: string; children: React.ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-3">
      <legend className="mb-2 font-serif text-lg font-bold">{legend}</legend>
      {children}
    </fieldset>
  );
}

function Select({ register, name, label, error, disabled, options, labels = {} }: { register: UseFormRegister<FormValues>; name: any; label: string; error?: string; disabled?: boolean; options: string[]; labels?: Record<string, string> }) {
  return (
    <SelectField label={label} error={error} disabled={disabled} {...register(name)}>
      <option value="">Choose…</option>
      {options.map((o) => (
        <option key={o} value={o}>{labels[o] ?? o}</option>
      ))}
    </SelectField>
  );
}
