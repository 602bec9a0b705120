import type { QueryInterface } from 'sequelize';
import * as m0001 from './0001-accounts';
import * as m0002 from './0002-documents';
import * as m0003 from './0003-uploads';
import * as m0004 from './0004-search';
import * as m0005 from './0005-replies';

export interface Migration {
  name: string;
  up: (params: { context: QueryInterface }) => Promise<void>;
  down: (params: { context: QueryInterface }) => Promise<void>;
}

/** Every migration in order. A new one is a new file here, appended; never edit one that shipped. */
export const migrations: Migration[] = [
  { name: '0001-accounts', ...m0001 },
  { name: '0002-documents', ...m0002 },
  { name: '0003-uploads', ...m0003 },
  { name: '0004-search', ...m0004 },
  { name: '0005-replies', ...m0005 },
];
