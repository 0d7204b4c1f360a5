/**
 * The body model and its loading: {@link dev.cairn.body.ModelLoader} reads an OBJ shape model (or a body description
 * of density regions) with its {@link dev.cairn.body.ModelSidecar}, converts to SI, inspects and orients the mesh,
 * settles density, GM and spin from a {@link dev.cairn.body.ModelRequest}, and gives the immutable
 * {@link dev.cairn.body.BodyModel} with its mass properties and field models. Depends on {@code io} (file formats,
 * input checks), {@code regions}, {@code mesh}, {@code mass}, {@code gravity} and {@code rotation}.
 */
package dev.cairn.body;
