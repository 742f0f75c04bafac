import type { ProjectRole } from '../../../shared/projects';

/** What each role may do, in words for the members panel and invitation page. */
export const ROLE_MEANING: Record<ProjectRole, string> = {
  owner: 'manages members and can delete the project',
  editor: 'uploads, edits metadata, runs analyses, makes access links',
  viewer: 'reads reports and comments',
};
