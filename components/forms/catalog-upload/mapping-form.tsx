'use client';

import { SelectField } from '@/components/ui/field';
import { POSITION_UNITS, withSystem, type MappingDraft } from './mapping-draft';
import type { PreviewColumn } from './preview-types';

type Props = {
  draft: MappingDraft;
  columns: PreviewColumn[];
  onChange: (d: MappingDraft) => void;
};

const UNIT_WORDS: Record<string, string> = {
  deg: 'degrees',
  rad: 'radians',
  hours: 'hours (decimal)',
  sexagesimal: 'sexagesimal (h:m:s / d:m:s)',
  arcsec: 'arcsec',
  arcmin: 'arcmin',
  mas: 'milliarcsec',
  'km/s': 'km/s',
  'm/s': 'm/s',
  kpc: 'kpc',
  pc: 'pc',
};

const SIZE_UNITS = ['arcsec', 'arcmin', 'deg', 'mas', 'rad'];
const VELOCITY_UNITS = ['km/s', 'm/s'];
const DISTANCE_UNITS = ['kpc', 'pc'];

function Options({
  values,
  words = UNIT_WORDS,
}: {
  values: readonly string[];
  words?: Record<string, string>;
}) {
  return values.map((v) => (
    <option key={v} value={v}>
      {words[v] ?? v}
    </option>
  ));
}

function ColumnSelect({
  label,
  value,
  columns,
  required,
  onChange,
}: {
  label: string;
  value: string;
  columns: PreviewColumn[];
  required?: boolean;
  onChange: (column: string) => void;
}) {
  return (
    <SelectField
      label={label}
      value={value}
      required={required}
      onChange={(e) => onChange(e.target.value)}
    >
      <option value="">{required ? 'Choose a column…' : 'not in this file'}</option>
      {columns.map((c) => (
        <option key={c.name} value={c.name}>
          {c.unit ? `${c.name} [${c.unit}]` : c.name}
        </option>
      ))}
    </SelectField>
  );
}

function Group({
  title,
  hint,
  children,
}: {
  title: string;
  hint?: string;
  children: React.ReactNode;
}) {
  return (
    <fieldset className="rounded-md border border-rule bg-paper/60 p-3">
      <legend className="px-1 text-xs font-semibold tracking-wide text-ink-soft">{title}</legend>
      {hint && <p className="mb-2 text-xs text-ink-soft">{hint}</p>}
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">{children}</div>
    </fieldset>
  );
}

/**
 * Which file column feeds each canonical field, in which unit, frame and convention. Only the
 * position is required; every other field may be "not in this file".
 */
export function MappingForm({ draft, columns, onChange }: Props) {
  const set = <K extends keyof MappingDraft>(key: K, value: MappingDraft[K]) =>
    onChange({ ...draft, [key]: value });
  const galactic = draft.system === 'galactic';
  const units = POSITION_UNITS[draft.system];
  return (
    <div className="space-y-4">
      <Group
        title="Position"
        hint="Equatorial positions are J2000 (ICRS) and are converted to Galactic l, b."
      >
        <SelectField
          label="Coordinate system"
          value={draft.system}
          onChange={(e) => onChange(withSystem(draft, e.target.value as MappingDraft['system']))}
        >
          <option value="galactic">Galactic (l, b)</option>
          <option value="equatorial">equatorial (RA, Dec)</option>
        </SelectField>
        <div className="hidden lg:block" />
        <ColumnSelect
          label={galactic ? 'Longitude column (l)' : 'Longitude column (RA)'}
          value={draft.lonColumn}
          columns={columns}
          required
          onChange={(v) => set('lonColumn', v)}
        />
        <SelectField
          label="Longitude unit"
          value={draft.lonUnit}
          onChange={(e) => set('lonUnit', e.target.value)}
        >
          <Options values={units.lon} />
        </SelectField>
        <ColumnSelect
          label={galactic ? 'Latitude column (b)' : 'Latitude column (Dec)'}
          value={draft.latColumn}
          columns={columns}
          required
          onChange={(v) => set('latColumn', v)}
        />
        <SelectField
          label="Latitude unit"
          value={draft.latUnit}
          onChange={(e) => set('latUnit', e.target.value)}
        >
          <Options values={units.lat} />
        </SelectField>
        <ColumnSelect
          label="Position error column"
          value={draft.positionErrorColumn}
          columns={columns}
          onChange={(v) => set('positionErrorColumn', v)}
        />
        <SelectField
          label="Position error unit"
          value={draft.positionErrorUnit}
          onChange={(e) => set('positionErrorUnit', e.target.value)}
        >
          <Options values={SIZE_UNITS} />
        </SelectField>
      </Group>

      <Group
        title="Velocity"
        hint="Heliocentric velocities are corrected to the LSR; optical and relativistic velocities are converted to the radio convention."
      >
        <ColumnSelect
          label="Velocity column"
          value={draft.velocityColumn}
          columns={columns}
          onChange={(v) => set('velocityColumn', v)}
        />
        <SelectField
          label="Velocity unit"
          value={draft.velocityUnit}
          onChange={(e) => set('velocityUnit', e.target.value)}
        >
          <Options values={VELOCITY_UNITS} />
        </SelectField>
        <SelectField
          label="Velocity frame"
          value={draft.velocityFrame}
          onChange={(e) => set('velocityFrame', e.target.value)}
        >
          <Options
            values={['lsr', 'heliocentric']}
            words={{ lsr: 'LSR', heliocentric: 'heliocentric' }}
          />
        </SelectField>
        <SelectField
          label="Velocity convention"
          value={draft.velocityConvention}
          onChange={(e) => set('velocityConvention', e.target.value)}
        >
          <Options values={['radio', 'optical', 'relativistic']} words={{}} />
        </SelectField>
        <ColumnSelect
          label="Velocity error column"
          value={draft.velocityErrorColumn}
          columns={columns}
          onChange={(v) => set('velocityErrorColumn', v)}
        />
        <SelectField
          label="Velocity error unit"
          value={draft.velocityErrorUnit}
          onChange={(e) => set('velocityErrorUnit', e.target.value)}
        >
          <Options values={VELOCITY_UNITS} />
        </SelectField>
        <ColumnSelect
          label="Line width column"
          value={draft.lineWidthColumn}
          columns={columns}
          onChange={(v) => set('lineWidthColumn', v)}
        />
        <div className="grid grid-cols-2 gap-3">
          <SelectField
            label="Line width unit"
            value={draft.lineWidthUnit}
            onChange={(e) => set('lineWidthUnit', e.target.value)}
          >
            <Options values={VELOCITY_UNITS} />
          </SelectField>
          <SelectField
            label="Line width is"
            value={draft.lineWidthKind}
            onChange={(e) => set('lineWidthKind', e.target.value)}
          >
            <Options values={['fwhm', 'sigma']} words={{ fwhm: 'FWHM', sigma: 'σ' }} />
          </SelectField>
        </div>
      </Group>

      <Group title="Size" hint="Diameters and FWHM are halved to give a radius.">
        <ColumnSelect
          label="Size column"
          value={draft.sizeColumn}
          columns={columns}
          onChange={(v) => set('sizeColumn', v)}
        />
        <SelectField
          label="Size unit"
          value={draft.sizeUnit}
          onChange={(e) => set('sizeUnit', e.target.value)}
        >
          <Options values={SIZE_UNITS} />
        </SelectField>
        <SelectField
          label="Size is"
          value={draft.sizeKind}
          onChange={(e) => set('sizeKind', e.target.value)}
        >
          <Options values={['radius', 'diameter', 'fwhm']} words={{ fwhm: 'FWHM' }} />
        </SelectField>
      </Group>

      <Group
        title="Independent distance"
        hint="A distance measured without kinematics (parallax, spectrophotometry), if the catalog has one."
      >
        <ColumnSelect
          label="Distance column"
          value={draft.distanceColumn}
          columns={columns}
          onChange={(v) => set('distanceColumn', v)}
        />
        <SelectField
          label="Distance unit"
          value={draft.distanceUnit}
          onChange={(e) => set('distanceUnit', e.target.value)}
        >
          <Options values={DISTANCE_UNITS} />
        </SelectField>
        <ColumnSelect
          label="Distance error column"
          value={draft.distanceErrorColumn}
          columns={columns}
          onChange={(v) => set('distanceErrorColumn', v)}
        />
        <SelectField
          label="Distance error unit"
          value={draft.distanceErrorUnit}
          onChange={(e) => set('distanceErrorUnit', e.target.value)}
        >
          <Options values={DISTANCE_UNITS} />
        </SelectField>
      </Group>

      <Group title="Source name">
        <ColumnSelect
          label="Name column"
          value={draft.nameColumn}
          columns={columns}
          onChange={(v) => set('nameColumn', v)}
        />
      </Group>
    </div>
  );
}
