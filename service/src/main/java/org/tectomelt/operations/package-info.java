/**
 * One typed operation per computation the API offers: a request record in API units → a result
 * record, registered in {@link org.tectomelt.operations.Operations} with its name, path, cost class
 * and the numeric inputs and outputs a sweep or a study may address.
 *
 * <p>Nothing here imports Javalin or Jackson (ArchUnit checks it). Ranges, defaults, enums and
 * unknown fields are the spec's business ({@code org.tectomelt.contract.SpecContract}); an
 * operation states only what the spec cannot: rules across fields, limits that depend on the chosen
 * model (a lithology's maximum pressure) and the server's caps from {@link org.tectomelt.Config}.
 * Physical defaults live in the engine.
 */
package org.tectomelt.operations;
