import { Button, MessageBar, MessageBarBody, MessageBarTitle } from '@fluentui/react-components';
import { isRouteErrorResponse, useRouteError } from 'react-router-dom';

/** Shown when a page fails to render: say so plainly, offer a reload, keep the shell. */
export function RouteErrorBoundary() {
  const err = useRouteError();
  const message = isRouteErrorResponse(err) ? `${err.status} ${err.statusText}` : err instanceof Error ? err.message : 'Unknown error';
  return (
    <div style={{ padding: 32, maxWidth: 720 }}>
      <MessageBar intent="error" layout="multiline">
        <MessageBarBody>
          <MessageBarTitle>This page hit a problem</MessageBarTitle>
          {message}. Your saved work is safe on the server.
        </MessageBarBody>
      </MessageBar>
      <Button style={{ marginTop: 16 }} onClick={() => window.location.reload()}>Reload the page</Button>
    </div>
  );
}
