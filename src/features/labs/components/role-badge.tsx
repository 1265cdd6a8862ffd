import { Badge } from '../../../components/badge';
import { labRoleLabels, type LabRole } from '../../../../shared/lab-roles';

const look: Record<LabRole, { tone: 'dusk' | 'reed' | 'mist'; icon: string }> = {
  lead: { tone: 'dusk', icon: '★' },
  curator: { tone: 'reed', icon: '✎' },
  depositor: { tone: 'mist', icon: '↥' },
};

export const RoleBadge = ({ role }: { role: LabRole }) => <Badge {...look[role]}>{labRoleLabels[role]}</Badge>;
