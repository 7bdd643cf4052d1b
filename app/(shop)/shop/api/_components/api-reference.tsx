'use client';
/** The API description rendered by swagger-ui-react with its own shipped styles; loaded in the browser only. */
import dynamic from 'next/dynamic';
import 'swagger-ui-react/swagger-ui.css';

const SwaggerUI = dynamic(() => import('swagger-ui-react'), { ssr: false, loading: () => <p className="text-muted">Loading the API reference…</p> });

export function ApiReference() {
  return (
    <div className="rounded-2xl bg-white p-2 text-black" data-testid="api-reference">
      <SwaggerUI url="/api/openapi.json" docExpansion="list" defaultModelsExpandDepth={0} tryItOutEnabled={false} />
    </div>
  );
}
