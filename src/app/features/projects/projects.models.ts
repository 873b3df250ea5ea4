import { Role } from '../../core/auth/auth.models';

/** A member as `GET /api/projects` lists them. */
export interface ProjectMember {
  id: number;
  name: string;
  role: Role;
}

/** One project: runs belong to a project, and only its members write and sign them. */
export interface Project {
  id: number;
  /** Short code, capitals and digits, e.g. `GX`. */
  code: string;
  name: string;
  description: string;
  members: ProjectMember[];
}

export interface ProjectListBody {
  items: Project[];
}

/** Body of `POST /api/projects`. */
export interface NewProject {
  code: string;
  name: string;
  description: string;
}
