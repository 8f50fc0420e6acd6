import { PASSWORD_MAX_BYTES, PASSWORD_MIN_LENGTH } from '../../../auth/passwords.js';
import { PERMISSIONS } from '../../../auth/permissions.js';
import { KEY_SCOPES } from '../../../models/api-key.js';
import { ROLES } from '../../../models/user.js';
import { AUDIT_ACTIONS } from '../../../services/audit.js';
import { Id, Pagination, Timestamp, emailAddress, pageOf, z } from './common.js';

const Email = emailAddress().openapi({ example: 'sam.carter@example.com' });
const Password = z
  .string()
  .min(PASSWORD_MIN_LENGTH, `must be at least ${PASSWORD_MIN_LENGTH} characters`)
  .refine((p) => Buffer.byteLength(p, 'utf8') <= PASSWORD_MAX_BYTES, `must be at most ${PASSWORD_MAX_BYTES} bytes`)
  .openapi({ description: `At least ${PASSWORD_MIN_LENGTH} characters, at most ${PASSWORD_MAX_BYTES} bytes (UTF-8)` });
const PersonName = z.string().trim().min(1, 'must not be empty').max(200);
const LinkToken = z.string().min(1).max(200).openapi({ description: 'The `token` parameter of the e-mailed link' });
export const RoleSchema = z.enum(ROLES).openapi('Role');
export const KeyScopeSchema = z.enum(KEY_SCOPES).openapi('KeyScope', { description: '`ingest`: create traces and append samples; `read`: read everything in the organisation' });

const UserSummary = z.object({ id: Id, email: z.string(), name: z.string(), role: RoleSchema }).openapi('UserSummary');
const OrganisationSummary = z.object({ id: Id, name: z.string() }).openapi('OrganisationSummary');

export const SignInBody = z.object({ email: Email, password: z.string().min(1).max(1000) }).strict().openapi('SignIn');
export const SignedIn = z
  .object({
    token: z.string().openapi({ description: 'Session token: send as `Authorization: Bearer <token>`' }),
    expiresAt: Timestamp.openapi({ description: 'Fixed end of the session (12 hours after sign-in)' }),
    user: UserSummary,
    organisation: OrganisationSummary,
  })
  .openapi('SignedIn');

export const PasswordResetBody = z.object({ email: Email }).strict().openapi('PasswordResetRequest');
export const PasswordResetCompleteBody = z.object({ token: LinkToken, password: Password }).strict().openapi('PasswordResetComplete');
export const InvitationAcceptBody = z.object({ token: LinkToken, name: PersonName, password: Password }).strict().openapi('InvitationAccept');

export const Me = z
  .object({
    user: UserSummary.nullable(),
    organisation: OrganisationSummary,
    apiKey: z.object({ id: z.string(), name: z.string(), scopes: z.array(KeyScopeSchema) }).nullable(),
    permissions: z.array(z.enum(Object.keys(PERMISSIONS) as [keyof typeof PERMISSIONS])).openapi({ description: 'Permissions the caller holds' }),
    sessionExpiresAt: Timestamp.nullable(),
  })
  .openapi('Me');

export const User = z
  .object({
    id: Id,
    email: z.string(),
    name: z.string(),
    role: RoleSchema,
    status: z.enum(['invited', 'active', 'deactivated']),
    createdAt: Timestamp,
    updatedAt: Timestamp,
  })
  .openapi('User');
export const UserPage = pageOf(User, 'UserPage');
export const UserParams = z.object({ userId: Id });
export const UserListQuery = Pagination.extend({ q: z.string().trim().max(200).optional().openapi({ description: 'Part of the name or e-mail' }) });
export const UserInvite = z.object({ email: Email, name: PersonName, role: RoleSchema }).strict().openapi('UserInvite');
export const UserUpdate = z
  .object({ role: RoleSchema.optional(), active: z.boolean().optional().openapi({ description: 'false deactivates the user and ends their sessions at once' }) })
  .strict()
  .refine((v) => v.role !== undefined || v.active !== undefined, 'give role or active')
  .openapi('UserUpdate');

export const ApiKey = z
  .object({
    id: z.string().openapi({ example: '3f9c2a7b51d04e8a' }),
    name: z.string(),
    scopes: z.array(KeyScopeSchema),
    prefix: z.string().openapi({ description: 'The start of the key, to recognise it', example: 'hrk_3f9c2a7b51d04e8a_' }),
    status: z.enum(['active', 'revoked', 'expired']),
    createdBy: z.object({ id: Id, name: z.string(), email: z.string() }).nullable(),
    createdAt: Timestamp,
    expiresAt: Timestamp.nullable(),
    lastUsedAt: Timestamp.nullable().openapi({ description: 'Last use, to the minute' }),
    lastUsedFrom: z.string().nullable().openapi({ description: 'Network address of the last use' }),
    revokedAt: Timestamp.nullable(),
    rotatedAt: Timestamp.nullable(),
  })
  .openapi('ApiKey');
export const ApiKeyPage = pageOf(ApiKey, 'ApiKeyPage');
export const ApiKeyParams = z.object({ keyId: z.string().regex(/^[0-9a-f]{16}$/, 'must be a key id (16 hex digits)') });
export const ApiKeyCreate = z
  .object({
    name: PersonName.openapi({ example: 'Panel logger, Millbrook hall' }),
    scopes: z.array(KeyScopeSchema).min(1, 'give at least one scope'),
    expiresAt: z.iso
      .datetime({ offset: true })
      .transform((s) => new Date(s))
      .nullable()
      .optional()
      .openapi({ description: 'Optional expiry (ISO 8601, in the future)', type: 'string', format: 'date-time' }),
  })
  .strict()
  .openapi('ApiKeyCreate');
export const ApiKeyWithSecret = z
  .object({
    apiKey: ApiKey,
    secret: z.string().openapi({ description: 'The full key, shown this once only: store it now', example: 'hrk_3f9c2a7b51d04e8a_…' }),
  })
  .openapi('ApiKeyWithSecret');

export const AuditEvent = z
  .object({
    id: Id,
    action: z.enum(AUDIT_ACTIONS),
    actor: z.object({ kind: z.enum(['user', 'key', 'system']), id: z.string().nullable(), label: z.string().nullable() }),
    target: z.object({ kind: z.enum(['user', 'api-key']), id: z.string(), label: z.string().nullable() }).nullable(),
    address: z.string().nullable(),
    details: z.record(z.string(), z.unknown()).nullable(),
    createdAt: Timestamp,
  })
  .openapi('AuditEvent');
export const AuditEventPage = pageOf(AuditEvent, 'AuditEventPage');
export const AuditListQuery = Pagination.extend({ action: z.enum(AUDIT_ACTIONS).optional() });

export const MailboxMessage = z
  .object({
    id: z.string(),
    from: z.string(),
    to: z.array(z.string()),
    subject: z.string(),
    text: z.string(),
    html: z.string().nullable(),
    attachments: z.array(z.object({ filename: z.string().nullable(), contentType: z.string(), size: z.number().int() })),
    receivedAt: Timestamp,
  })
  .openapi('MailboxMessage');
export const Mailbox = z.object({ items: z.array(MailboxMessage) }).openapi('Mailbox');
