/**
 * The HTTP skin: routes, request and response records in the API's units, validation and the
 * mapping of failures to RFC 9457 problem+json. Handlers stay thin: parse, validate, convert to
 * SI, call the engine, convert back, write.
 */
package org.tectomelt.http;
