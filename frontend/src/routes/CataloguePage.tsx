import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { can } from '@shared/policy';
import { useArmModels, type ArmModelDto } from '../api/armModels';
import { useSessionUser } from '../api/auth';
import { Button } from '../components/Button';
import { BuiltInBadge } from '../components/catalogue/BuiltInBadge';
import { familyLabel } from '@shared/words';
import { formatMm } from '../components/catalogue/profileDrawing';
import { DataTable } from '../components/DataTable';
import { EmptyState, ErrorNotice, LoadingNotice } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import { usePageTitle } from '../lib/usePageTitle';

/** One catalogue row with the figures the table sorts on. */
interface Row {
  id: number;
  name: string;
  family: string;
  maxReach: number | null;
  payloadKg: number | null;
  stopTimeS: number | null;
  builtIn: boolean;
}

const column = createColumnHelper<Row>();
const dash = <span className="text-ink-faint">—</span>;

const COLUMNS = [
  column.accessor('name', {
    header: 'Name',
    cell: (info) => (
      <Link to={`/catalogue/${info.row.original.id}`} className="font-bold text-ink underline-offset-4 hover:text-accent hover:underline">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor((r) => familyLabel(r.family), { id: 'family', header: 'Family' }),
  column.accessor('maxReach', {
    header: 'Tool-point reach',
    cell: (info) => (info.getValue() == null ? dash : <span className="tabular-nums">{formatMm(info.getValue()!)}</span>),
    enableGlobalFilter: false,
    sortUndefined: 'last',
  }),
  column.accessor('payloadKg', {
    header: 'Payload',
    cell: (info) => (info.getValue() == null ? dash : <span className="tabular-nums">{info.getValue()} kg</span>),
    enableGlobalFilter: false,
  }),
  column.accessor('stopTimeS', {
    header: 'Stop time',
    cell: (info) => (info.getValue() == null ? dash : <span className="tabular-nums">{info.getValue()} s</span>),
    enableGlobalFilter: false,
  }),
  column.accessor('builtIn', {
    header: 'Source',
    cell: (info) => (info.getValue() ? <BuiltInBadge /> : <span className="text-ink-muted">Own model</span>),
    enableGlobalFilter: false,
  }),
];

function toRow(m: ArmModelDto): Row {
  return {
    id: m.id,
    name: m.name,
    family: m.family,
    maxReach: m.maxReach,
    payloadKg: typeof m.params.payloadKg === 'number' ? m.params.payloadKg : null,
    stopTimeS: typeof m.params.stopTimeS === 'number' ? m.params.stopTimeS : null,
    builtIn: m.builtIn,
  };
}

/** The arm catalogue: every model with its reach, payload and stopping time; planners add their own. */
export default function CataloguePage() {
  usePageTitle('Arm catalogue');
  const user = useSessionUser();
  const models = useArmModels();
  const navigate = useNavigate();
  const mayWrite = can(user.role, 'armModel.write');
  const rows = useMemo(() => (models.data ?? []).map(toRow), [models.data]);
  const newButton = mayWrite ? (
    <Button variant="primary" onClick={() => void navigate('/catalogue/new')}>
      New model
    </Button>
  ) : null;

  return (
    <>
      <PageHeader
        title="Arm catalogue"
        lead="Kinematic models of the arms you place on layouts: link lengths, axis limits, tooling and stopping data. Built-in models are read-only; duplicate one to make it your own."
        actions={newButton}
      />
      {models.isPending && <LoadingNotice label="Loading the catalogue…" />}
      {models.isError && <ErrorNotice title="The catalogue could not be loaded" error={models.error} />}
      {models.isSuccess && rows.length === 0 && (
        <EmptyState title="The catalogue is empty." action={newButton}>
          {mayWrite ? 'Define the first arm model: its family, link lengths and axis limits.' : 'Arm models appear here once a planner defines them.'}
        </EmptyState>
      )}
      {models.isSuccess && rows.length > 0 && (
        <DataTable
          label="Arm models"
          data={rows}
          columns={COLUMNS}
          getRowId={(r) => String(r.id)}
          filterLabel="Filter models"
          filterPlaceholder="Name or family"
          noMatch="No model matches the filter. Clear the filter box to see the whole catalogue."
        />
      )}
    </>
  );
}
