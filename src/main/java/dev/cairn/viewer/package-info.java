/**
 * The 3D viewer and the headless renderer: the shape model as a lit, flat-shaded mesh coloured facet by facet with a
 * surveyed quantity (slope, effective gravity, effective potential, dynamic height, lift-off, landing zones), legend,
 * navigation, overlays and picking; and the same view written to PNG from an offscreen snapshot.
 *
 * <p>This is the only package that may import JavaFX. It depends on {@code mesh}, {@code mass}, {@code io} and
 * {@code cli} (to run the survey programmatically), never the other way round. Classes named in picocli's
 * subcommand list ({@link dev.cairn.viewer.ViewCommand}, {@link dev.cairn.viewer.RenderCommand}) keep JavaFX types
 * out of their fields and signatures and start the toolkit lazily, so that the command line loads on a machine with
 * no display. The colour ramps, survey reader and atlas mapping are plain Java and are tested without a display.
 *
 * <p>Conventions of the values shown: SI units, model (body-fixed) frame, potential U &gt; 0 and acceleration =
 * grad U (Werner–Scheeres convention). Caution: results must be verified independently before operational use;
 * mission rules and the responsible flight-dynamics authority decide.
 */
package dev.cairn.viewer;
