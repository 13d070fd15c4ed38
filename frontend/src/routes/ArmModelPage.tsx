import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { can } from '@shared/policy';
import { copyName, useArmModel, useArmModels, useCreateArmModel, useDeleteArmModel, useUpdateArmModel, type ArmModelDto } from '../api/armModels';
import { useSessionUser } from '../api/auth';
import { isApiError } from '../api/client';
import { Button } from '../components/Button';
import { ArmModelEditor } from '../components/catalogue/ArmModelEditor';
import { BuiltInBadge } from '../components/catalogue/BuiltInBadge';
import type { ArmModelFormValues } from '../components/catalogue/familyDefaults';
import { ConfirmDialog } from '../components/ConfirmDialog';
import { ErrorNotice, LoadingNotice, StatusNote } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import NotFoundPage from './NotFoundPage';
import { parseId } from '../lib/routeId';
import { usePageTitle } from '../lib/usePageTitle';

/** One arm model: its parameters, side reach profile and pose panel; editable when it is one's own. */
export default function ArmModelPage() {
  const id = parseId(useParams().id);
  if (id === null) return <NotFoundPage />;
  return <ArmModelView id={id} />;
}

function ArmModelView({ id }: { id: number }) {
  const model = useArmModel(id);
  usePageTitle(model.data?.name ?? 'Arm model', 'Arm catalogue');
  if (model.isPending) return <LoadingNotice label="Loading the arm model…" />;
  if (model.isError) {
    return (
      <div className="flex max-w-xl flex-col gap-4 py-6">
        <h1 className="text-2xl font-bold">{isApiError(model.error, 404) ? 'Arm model not found' : 'The arm model could not be loaded'}</h1>
        <ErrorNotice error={model.error} />
        <Link to="/catalogue" className="text-sm font-bold text-accent underline underline-offset-4">
          Back to the catalogue
        </Link>
      </div>
    );
  }
  return <ArmModelDetail key={model.data.id} model={model.data} />;
}

function ArmModelDetail({ model }: { model: ArmModelDto }) {
  const user = useSessionUser();
  const navigate = useNavigate();
  const list = useArmModels();
  const update = useUpdateArmModel(model.id);
  const create = useCreateArmModel();
  const remove = useDeleteArmModel(model.id);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const [saved, setSaved] = useState(false);
  const mayWrite = can(user.role, 'armModel.write');
  const readOnly = model.builtIn || !mayWrite;

  const duplicate = async () => {
    const name = copyName(model.name, (list.data ?? []).map((m) => m.name));
    const copy = await create.mutateAsync({ name, params: model.params as never });
    void navigate(`/catalogue/${copy.id}`);
  };

  const actions = (
    <>
      {mayWrite && (
        <Button onClick={() => void duplicate().catch(() => {})} busy={create.isPending}>
          Duplicate
        </Button>
      )}
      {mayWrite && !model.builtIn && (
        <Button variant="danger" onClick={() => setConfirmDelete(true)}>
          Delete
        </Button>
      )}
    </>
  );

  return (
    <>
      <PageHeader
        eyebrow={
          <Link to="/catalogue" className="hover:text-accent">
            Arm catalogue
          </Link>
        }
        title={model.name}
        lead={
          model.builtIn ? (
            <span className="inline-flex items-center gap-2">
              <BuiltInBadge /> Ships with Ringfence and cannot be changed.{mayWrite ? ' Duplicate it to edit a copy of your own.' : ''}
            </span>
          ) : readOnly ? (
            'Your role can read the catalogue but not change it.'
          ) : (
            'Changes redraw the side reach profile as you type; save to use them on cell layouts.'
          )
        }
        actions={readOnly ? actions : null}
      />
      {create.isError && <ErrorNotice title="The copy could not be made" error={create.error} className="mb-4" />}
      {saved && <StatusNote>Saved.</StatusNote>}
      <ArmModelEditor
        initial={{ name: model.name, params: model.params as ArmModelFormValues['params'] }}
        readOnly={readOnly}
        submitLabel="Save model"
        actions={readOnly ? undefined : actions}
        onChange={() => setSaved(false)}
        onSubmit={async (values) => {
          await update.mutateAsync(values);
          setSaved(true);
        }}
      />
      <ConfirmDialog
        open={confirmDelete}
        title={`Delete "${model.name}"?`}
        confirmLabel="Delete model"
        busy={remove.isPending}
        error={remove.error}
        onClose={() => {
          setConfirmDelete(false);
          remove.reset();
        }}
        onConfirm={() =>
          remove.mutate(undefined, {
            onSuccess: () => {
              setConfirmDelete(false);
              void navigate('/catalogue');
            },
          })
        }
      >
        The model leaves the catalogue. A model that is placed on a cell layout cannot be deleted until it is removed there.
      </ConfirmDialog>
    </>
  );
}
