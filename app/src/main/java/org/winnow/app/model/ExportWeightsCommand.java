package org.winnow.app.model;

import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.concurrent.Callable;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.OutputPaths;
import org.winnow.app.cli.WinnowCli;
import org.winnow.scorer.model.FrozenModel;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow export-weights}: writes a frozen model's weights, input normalisation, vote settings
 * and reference embeddings as JSON, for independent re-implementations (the bench's numpy scorer).
 */
@Command(name = "export-weights", mixinStandardHelpOptions = true,
        description = {
            "Write a frozen model's weights, normalisation, vote settings and labelled reference as JSON.",
            "The format is winnow-weights v1 (see bench/README.md): network weights, input normalisation, vote "
                    + "settings and the reference embeddings with their labels."})
public final class ExportWeightsCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--model", required = true, paramLabel = "M", description = "The frozen model (.wnm).")
    Path model;

    @Option(names = "--out", required = true, paramLabel = "F", description = "Where to write the JSON.")
    Path out;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        String same = OutputPaths.sameFileProblem(out, "--out", model, "--model");
        if (same != null) {
            return Exit.badInput(err, "export-weights", same);
        }
        FrozenModel m;
        try {
            m = FrozenModel.load(model);
        } catch (NoSuchFileException e) {
            return Exit.badInput(err, "export-weights", model + ": no such file");
        } catch (IOException e) {
            return Exit.badInput(err, "export-weights", e.getMessage());
        }
        ObjectMapper json = new ObjectMapper();
        Path tmp = out.resolveSibling(out.getFileName() + ".tmp");
        try {
            json.writeValue(tmp.toFile(), WeightsExport.of(m, json));
            Files.move(tmp, out, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            return Exit.badInput(err, "export-weights", out + ": cannot write (" + e.getMessage() + ")");
        }
        return 0;
    }
}
