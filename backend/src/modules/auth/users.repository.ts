import type { Role } from '../../../../shared/roles';
import { User } from '../../entities/user.entity';
import { db } from '../../lib/db';

export async function upsertUser(input: { subject: string; email: string; name: string; roles: Role[] }) {
  const repo = db().getRepository(User);
  await repo.upsert(
    {
      subject: input.subject,
      email: input.email.toLowerCase(),
      name: input.name,
      roles: input.roles,
      lastSignInAt: new Date(),
    },
    { conflictPaths: ['subject'] },
  );
  const user = await repo.findOneByOrFail({ subject: input.subject });
  return { id: user.id, email: user.email, name: user.name, roles: user.roles as Role[] };
}

export async function findUserById(id: string) {
  return db().getRepository(User).findOneBy({ id });
}
