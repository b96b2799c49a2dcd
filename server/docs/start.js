// Loaded as a file so the page satisfies the strict Content-Security-Policy (no inline script).
window.SwaggerUIBundle({ url: '/api/v1/openapi.json', dom_id: '#reference', deepLinking: true })
