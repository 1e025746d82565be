import { WEBHOOK_SIGNATURE_HEADER, WEBHOOK_TIMESTAMP_HEADER, WEBHOOK_TOLERANCE_SECONDS } from '@shared/consumers';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { KeyForm } from './KeyForm';
import { KeysTable } from './KeysTable';
import { WebhookForm } from './WebhookForm';
import { WebhooksTable } from './WebhooksTable';

/** Admins manage who may read released fits (API keys) and who is told of new releases (webhooks). */
export function ConsumersPage() {
  const { workspaceId, workspaceName, role } = useCurrentWorkspace();
  const origin = window.location.origin;
  return (
    <>
      <PageHeader
        title="API keys and webhooks"
        description={`Dashboards and services outside Lariat read the released fits of ${workspaceName} with an API key, and can be told when a release changes.`}
      />
      {role !== 'admin' ? (
        <Notice>Only admins of this workspace manage API keys and webhooks.</Notice>
      ) : (
        <div className="space-y-8">
          <Notice>
            <p>
              Consumers call <code>{origin}/api/v1/models</code> with the header <code>Authorization: Bearer lariat_…</code>. The full description is at{' '}
              <a className="underline" href="/api/v1/openapi.json">
                /api/v1/openapi.json
              </a>{' '}
              (OpenAPI 3.1).
            </p>
            <p className="mt-2">
              Webhook receivers check <code>{WEBHOOK_SIGNATURE_HEADER}</code>: <code>v1=</code> followed by the hex HMAC-SHA256 of{' '}
              <code>{`<${WEBHOOK_TIMESTAMP_HEADER}>.<body>`}</code> with the webhook’s secret, and refuse a timestamp more than {WEBHOOK_TOLERANCE_SECONDS / 60}{' '}
              minutes from their clock.
            </p>
          </Notice>
          <KeyForm workspaceId={workspaceId} />
          <section aria-labelledby="keys-heading">
            <h2 id="keys-heading" className="mb-2 text-lg font-bold">
              Keys
            </h2>
            <KeysTable workspaceId={workspaceId} />
          </section>
          <WebhookForm workspaceId={workspaceId} />
          <section aria-labelledby="hooks-heading">
            <h2 id="hooks-heading" className="mb-2 text-lg font-bold">
              Webhooks
            </h2>
            <WebhooksTable workspaceId={workspaceId} />
          </section>
        </div>
      )}
    </>
  );
}
