// Renders /openapi.yaml with the packaged swagger-ui. No validator badge (it would call an outside
// service) and no "try it out" by default: the page at / is the place to compute.
window.addEventListener("load", () => {
  window.SwaggerUIBundle({
    url: "/openapi.yaml",
    dom_id: "#reference",
    validatorUrl: null,
    deepLinking: true,
    supportedSubmitMethods: [],
  });
});
