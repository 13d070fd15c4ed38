import { z } from 'zod';
import { multiLineText, singleLineText } from './fields';
import type { Role } from './user';

export const ProjectInput = z.object({
  name: singleLineText().min(1, 'Enter a project name').max(160),
  clientName: singleLineText().min(1, 'Enter the client').max(160),
  siteName: singleLineText().max(160).default(''),
  description: multiLineText().max(4000).default(''),
});
export type ProjectInput = z.input<typeof ProjectInput>;

export const ProjectUpdateInput = z
  .object({
    name: singleLineText().min(1, 'Enter a project name').max(160),
    clientName: singleLineText().min(1, 'Enter the client').max(160),
    siteName: singleLineText().max(160),
    description: multiLineText().max(4000),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type ProjectUpdateInput = z.infer<typeof ProjectUpdateInput>;

export const MemberInput = z.object({ userId: z.coerce.number().int().positive('Choose a user') });

export interface MemberDto {
  userId: number;
  email: string;
  name: string;
  role: Role;
  addedAt: string;
}

export interface ProjectDto {
  id: number;
  name: string;
  clientName: string;
  siteName: string;
  description: string;
  createdAt: string;
  updatedAt: string;
  createdBy: { id: number; name: string } | null;
  memberCount: number;
  /** When the project was archived (hidden from lists, read-only); null while active. */
  archivedAt: string | null;
}

export interface ProjectDetailDto extends ProjectDto {
  members: MemberDto[];
}
