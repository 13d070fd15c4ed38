import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { can } from '@shared/policy';
import { useCreateArmModel } from '../api/armModels';
import { useSessionUser } from '../api/auth';
import { ArmModelEditor } from '../components/catalogue/ArmModelEditor';
import { defaultParams } from '../components/catalogue/familyDefaults';
import { FAMILY_LABELS } from '../components/catalogue/modelCore';
import { SelectField } from '../components/Field';
import { NotAllowed } from '../components/NotAllowed';
import { PageHeader } from '../components/PageHeader';
import { usePageTitle } from '../lib/usePageTitle';

/** A new arm model: choose the kinematic family, then fill in its parameters with the profile drawn live. */
export default function ArmModelNewPage() {
  usePageTitle('New arm model', 'Arm catalogue');
  const user = useSessionUser();
  const navigate = useNavigate();
  const create = useCreateArmModel();
  const [family, setFamily] = useState(Object.keys(FAMILY_LABELS)[0]);
  if (!can(user.role, 'armModel.write')) return <NotAllowed />;
  return (
    <>
      <PageHeader
        eyebrow={
          <Link to="/catalogue" className="hover:text-accent">
            Arm catalogue
          </Link>
        }
        title="New arm model"
        lead="Start from a typical arm of the family and change it to the arm's data sheet."
      />
      <SelectField label="Kinematic family" value={family} onChange={(e) => setFamily(e.target.value)} frameClassName="mb-6 max-w-xs">
        {Object.entries(FAMILY_LABELS).map(([value, label]) => (
          <option key={value} value={value}>
            {label}
          </option>
        ))}
      </SelectField>
      <ArmModelEditor
        key={family}
        initial={{ name: '', params: defaultParams(family) }}
        readOnly={false}
        submitLabel="Create model"
        onCancel={() => void navigate('/catalogue')}
        onSubmit={async (values) => {
          const model = await create.mutateAsync(values);
          void navigate(`/catalogue/${model.id}`, { replace: true });
        }}
      />
    </>
  );
}
