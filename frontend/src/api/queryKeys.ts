/**
 * Query keys, one factory per resource. Keys nest from general to specific so that
 * `invalidateQueries({queryKey: projectKeys.all})` reaches every project query.
 * Pages added later (arm models, floor plans, layouts) add their own factory here.
 */
export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

export const projectKeys = {
  all: ['projects'] as const,
  lists: () => [...projectKeys.all, 'list'] as const,
  /** 'active' lists the projects in use; 'archived' the archived ones. */
  list: (show: 'active' | 'archived' = 'active') => [...projectKeys.lists(), show] as const,
  details: () => [...projectKeys.all, 'detail'] as const,
  detail: (id: number) => [...projectKeys.details(), id] as const,
};

export const userKeys = {
  all: ['users'] as const,
  lists: () => [...userKeys.all, 'list'] as const,
  list: () => [...userKeys.lists()] as const,
};

export const floorPlanKeys = {
  all: ['floorPlans'] as const,
  lists: () => [...floorPlanKeys.all, 'list'] as const,
  list: (projectId: number) => [...floorPlanKeys.lists(), projectId] as const,
  details: () => [...floorPlanKeys.all, 'detail'] as const,
  detail: (id: number) => [...floorPlanKeys.details(), id] as const,
  savedRoles: (projectId: number) => [...floorPlanKeys.all, 'savedRoles', projectId] as const,
};

export const layoutKeys = {
  all: ['layouts'] as const,
  lists: () => [...layoutKeys.all, 'list'] as const,
  list: (projectId: number) => [...layoutKeys.lists(), projectId] as const,
  listOf: (projectId: number, show: 'active' | 'archived') => [...layoutKeys.list(projectId), show] as const,
  details: () => [...layoutKeys.all, 'detail'] as const,
  /** The server's analysis of the stored layout (the editor's first view while its worker starts). */
  firstView: (id: number) => [...layoutKeys.all, 'firstView', id] as const,
  detail: (id: number) => [...layoutKeys.details(), id] as const,
};

export const armModelKeys = {
  all: ['armModels'] as const,
  lists: () => [...armModelKeys.all, 'list'] as const,
  list: () => [...armModelKeys.lists()] as const,
  details: () => [...armModelKeys.all, 'detail'] as const,
  detail: (id: number) => [...armModelKeys.details(), id] as const,
};
