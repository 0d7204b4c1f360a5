/** Small shared helpers with no domain knowledge (progress reporting, parallel loops). No JavaFX. */
package dev.cairn.util;
