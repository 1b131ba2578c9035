/**
 * The command line: picocli commands, thin wrappers that parse options, call the jobs and print.
 * Errors: {@link org.echotrellis.InputException} and usage errors give one line on stderr and exit
 * code 2; anything else exit code 1; stack traces only with {@code --debug}.
 *
 * <p>The top of the dependency graph: nothing else in the project imports this package.
 */
package org.echotrellis.cli;
