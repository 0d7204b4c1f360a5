/**
 * The body's spin state and, in later work, the rotating (body-fixed) frame: effective potential
 * {@code V = U + ½ω²|ω̂×r|²} and effective acceleration (gravity + centrifugal). SI units; no JavaFX.
 */
package dev.cairn.rotation;
