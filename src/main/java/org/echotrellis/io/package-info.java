/**
 * File input and output shared by the commands: atomic writes that never overwrite without
 * permission, JSON, and (with the fitting commands) NIfTI-1 volumes and CSV decay tables.
 *
 * <p>May depend on {@code epg} and {@code sequence}; must not import {@code fit}, {@code pathway},
 * {@code design}, {@code plot} or {@code cli}.
 */
package org.echotrellis.io;
