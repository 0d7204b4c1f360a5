package dev.cairn.cli;

import java.nio.file.Path;
import picocli.CommandLine.Option;

/**
 * The Slurm job-array options shared by {@code table} and {@code deploy} (see {@link SlurmArray} and
 * docs/cluster.md); each command checks them against its own other options.
 */
public final class SlurmOptions {
    @Option(names = "--slurm", paramLabel = "N", description = "Instead of computing, write a Slurm job array of N "
        + "shards (1 to " + SlurmArray.MAX_TASKS + ") and a merge job that runs after all of them, in OUT.slurm/ "
        + "beside --out (see docs/cluster.md).")
    Integer slurm;

    @Option(names = "--slurm-submit", description = "With --slurm: submit both jobs with sbatch and print their ids.")
    boolean slurmSubmit;

    @Option(names = "--slurm-cpus", paramLabel = "C", description = "With --slurm: CPUs per task (--cpus-per-task; "
        + "also the --threads of each task unless --threads is given; default ${DEFAULT-VALUE}).")
    int slurmCpus = 1;

    @Option(names = "--slurm-sbatch", paramLabel = "FILE", description = "With --slurm: extra sbatch options for both "
        + "scripts, one per line (e.g. --partition=NAME, --time=HH:MM:SS, --mem=8G).")
    Path slurmSbatch;

    @Option(names = "--slurm-sbatch-command", hidden = true, paramLabel = "PROGRAM", description = "The sbatch program "
        + "(default ${DEFAULT-VALUE}; tests).")
    String sbatchCommand = "sbatch";
}
