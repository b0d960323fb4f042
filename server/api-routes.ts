/**
 * Registering an /api route always names its access (a permission, 'signed-in' or 'public'),
 * and every route lands in `table` so tests can check that each one is covered. A route under
 * `/projects/:id` also gets its project loaded after the guard (server/project-scope.ts).
 */
import { Router, type RequestHandler } from 'express';
import { guard, type Access } from './permissions';
import { PROJECT_PATH } from './project-scope';

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';
export interface RouteSpec {
  method: Method;
  path: string;
  access: Access;
}

export class ApiRoutes {
  readonly router = Router();
  readonly table: RouteSpec[] = [];

  /** `projectScope`: the loadProject middleware of this app's database. */
  constructor(private readonly projectScope: RequestHandler) {}

  get(path: string, access: Access, ...handlers: RequestHandler[]) {
    return this.add('get', path, access, handlers);
  }
  post(path: string, access: Access, ...handlers: RequestHandler[]) {
    return this.add('post', path, access, handlers);
  }
  put(path: string, access: Access, ...handlers: RequestHandler[]) {
    return this.add('put', path, access, handlers);
  }
  patch(path: string, access: Access, ...handlers: RequestHandler[]) {
    return this.add('patch', path, access, handlers);
  }
  delete(path: string, access: Access, ...handlers: RequestHandler[]) {
    return this.add('delete', path, access, handlers);
  }

  private add(method: Method, path: string, access: Access, handlers: RequestHandler[]): this {
    this.table.push({ method, path, access });
    const scope = PROJECT_PATH.test(path) ? [this.projectScope] : [];
    this.router[method](path, guard(access), ...scope, ...handlers);
    return this;
  }
}
