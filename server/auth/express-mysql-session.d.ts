declare module 'express-mysql-session' {
  import type { Store } from 'express-session';
  import type expressSession from 'express-session';

  interface MySQLStoreOptions {
    clearExpired?: boolean;
    checkExpirationInterval?: number;
    expiration?: number;
    createDatabaseTable?: boolean;
    endConnectionOnClose?: boolean;
    schema?: { tableName?: string; columnNames?: { session_id?: string; expires?: string; data?: string } };
  }

  interface MySQLStore extends Store {
    clearExpiredSessions(): Promise<void>;
    onReady(): Promise<void>;
    close(): Promise<void>;
  }

  type MySQLStoreClass = new (options: MySQLStoreOptions, connection?: unknown) => MySQLStore;

  export default function createMySQLStore(session: typeof expressSession): MySQLStoreClass;
}
