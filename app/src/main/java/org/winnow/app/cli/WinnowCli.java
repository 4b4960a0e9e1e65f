package org.winnow.app.cli;

import org.winnow.app.cluster.ProduceCommand;
import org.winnow.app.cluster.ScoreCommand;
import org.winnow.app.cluster.SinkCommand;
import org.winnow.app.hodge.HodgeCommand;
import org.winnow.app.hodge.InvariantsCommand;
import org.winnow.app.hodge.LabelCommand;
import org.winnow.app.model.EvaluateCommand;
import org.winnow.app.model.ExportWeightsCommand;
import org.winnow.app.model.TrainCommand;
import org.winnow.app.scan.DemoCommand;
import org.winnow.app.scan.EnumerateCommand;
import org.winnow.app.scan.ScanCommand;
import org.winnow.app.scan.VerifyCommand;
import org.winnow.app.watch.WatchCommand;
import picocli.CommandLine.Command;
import picocli.CommandLine;

/** The {@code winnow} command line: one subcommand per job. */
@Command(
        name = "winnow",
        mixinStandardHelpOptions = true,
        versionProvider = WinnowCli.Version.class,
        description = "Prefilter complete-intersection Calabi-Yau configuration matrices before exact computation.",
        subcommands = {
            CommandLine.HelpCommand.class,
            DemoCommand.class,
            EnumerateCommand.class,
            ScanCommand.class,
            VerifyCommand.class,
            InvariantsCommand.class,
            TrainCommand.class,
            org.winnow.app.model.SampleCommand.class,
            EvaluateCommand.class,
            HodgeCommand.class,
            LabelCommand.class,
            ProduceCommand.class,
            ScoreCommand.class,
            SinkCommand.class,
            WatchCommand.class,
            ExportWeightsCommand.class,
            org.winnow.app.report.ReportCommand.class,
        })
public final class WinnowCli implements Runnable {
    /** Longest option error shown; picocli quotes the offending argument whole. */
    private static final int MESSAGE = 300;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(System.err);
    }

    /** Builds the command line with the project's conventions (exit 2 on bad options, said in one line). */
    public static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new WinnowCli());
        cl.setCaseInsensitiveEnumValuesAllowed(true);
        cl.setParameterExceptionHandler(WinnowCli::badOption);
        return cl;
    }

    /**
     * An option picocli cannot take (unknown, missing, not a number, out of an int's range): one line naming it
     * and where the options are listed, like every other refusal, instead of the message and the whole usage.
     */
    static int badOption(CommandLine.ParameterException e, String[] args) {
        CommandLine c = e.getCommandLine();
        String name = c.getCommandSpec().qualifiedName(" ");
        String message = e.getMessage() == null ? e.toString() : e.getMessage().strip();
        // The message quotes the user's argument, which may hold anything: control characters would break the
        // one line, and a pasted file would flood the terminal.
        message = message.replaceAll("\\p{Cntrl}", "?");
        if (message.length() > MESSAGE) {
            message = message.substring(0, MESSAGE) + "... (" + message.length() + " characters)";
        }
        String hint = " (" + name + " --help lists the " + (c.getCommandSpec().subcommands().isEmpty() ? "options)"
                : "commands)");
        if (!name.startsWith("winnow ")) {
            c.getErr().println(name + ": " + message + hint);
            c.getErr().flush();
            return Exit.BAD_INPUT;
        }
        return Exit.badInput(c.getErr(), name.substring("winnow ".length()), message + hint);
    }

    public static void main(String[] args) {
        CommandLine cl = commandLine();
        int code = cl.execute(args);
        System.exit(CheckedOutput.exitCode(code, cl.getOut(), System.out, System.err));
    }

    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            String v = WinnowCli.class.getPackage().getImplementationVersion();
            return new String[] {"winnow " + (v == null ? "development build" : v)};
        }
    }
}
