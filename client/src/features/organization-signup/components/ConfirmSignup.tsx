import { Link } from 'react-router-dom';
import type { OrganizationSignupConfirmedDto } from '../../../../../policies/dto';
import { OrganizationSignupConfirmSchema } from '../../../../../policies/schemas';
import { isApiError } from '../../../lib/api-client';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useConfirmSignup } from '../api/org-signup';

/** Reads the token from the confirmation link's fragment ('#<token>'), which never reaches the server's logs. */
export function signupTokenFromHash(hash: string): string | null {
  const raw = hash.startsWith('#') ? hash.slice(1) : hash;
  const parsed = OrganizationSignupConfirmSchema.safeParse({ token: decodeURIComponent(raw).trim() });
  return parsed.success ? parsed.data.token : null;
}

/**
 * One button rather than confirming on arrival: a link opened by a mail scanner or a preview
 * creates nothing, only the person pressing it does.
 */
export function ConfirmSignup({ hash, onConfirmed }: { hash: string; onConfirmed: (done: OrganizationSignupConfirmedDto) => void }) {
  const token = signupTokenFromHash(hash);
  const confirm = useConfirmSignup();

  if (token === null) {
    return (
      <Notice tone="problem" role="alert" title="This link is incomplete">
        <p>Open the whole link from the e-mail, or start the organization again.</p>
        <p>
          <Link to="/start">Start an organization</Link>
        </p>
      </Notice>
    );
  }
  const failure = confirm.error;
  const unusable = isApiError(failure) && failure.code === 'signup_invalid';

  return (
    <div className="space-y-4">
      {unusable ? (
        <Notice tone="problem" role="alert" title="This link can't be used">
          <p>{failure.message}</p>
          <p>
            <Link to="/start">Start an organization</Link>
          </p>
        </Notice>
      ) : (
        <ErrorNotice error={failure} />
      )}
      <p className="text-sm text-ink-2">
        Confirming proves the address is yours. The organization is created with you as its administrator, and you sign in next.
      </p>
      <Button size="lg" busy={confirm.isPending} onClick={() => confirm.mutate({ token }, { onSuccess: onConfirmed })}>
        Confirm and start the organization
      </Button>
    </div>
  );
}
