import type { RequestHandler } from 'express';
import { ROLE_LABELS } from '../../shared/roles';
import { forbidden, unauthenticated } from '../errors';
import type { UserModel } from '../models/user-model';
import type { Access } from './route';

/** The single place where a route's access rule meets the signed-in person. */
export function authorize(access: Access): RequestHandler {
  return (req, _res, next) => {
    if (access === 'public') return next();
    const user = req.user as UserModel | undefined;
    if (!user) return next(unauthenticated());
    if (access === 'signed-in' || access.includes(user.role)) return next();
    const allowed = access.map((role) => ROLE_LABELS[role].toLowerCase()).join(' or ');
    return next(forbidden(`Only a ${allowed} can do this; you are signed in as a ${ROLE_LABELS[user.role].toLowerCase()}.`));
  };
}
