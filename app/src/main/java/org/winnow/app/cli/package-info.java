/**
 * The entry point {@link org.winnow.app.cli.WinnowCli}, the exit codes and the one error path of every
 * command ({@link org.winnow.app.cli.Exit}), and what several command families share: the
 * {@code --metrics-port} and {@code --kafka} options, the process's meters and their loopback HTTP
 * server (which the watch dashboard also uses), run ids, and the terminal test.
 */
package org.winnow.app.cli;
