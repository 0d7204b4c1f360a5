package dev.cairn.cli;

import picocli.CommandLine.IVersionProvider;

/** Version from the jar manifest ("dev" when run from classes). */
public final class VersionProvider implements IVersionProvider {
    /** The Cairn version string. */
    public static String version() {
        String v = CairnMain.class.getPackage().getImplementationVersion();
        return v == null ? "dev" : v;
    }

    @Override
    public String[] getVersion() {
        return new String[] {"cairn " + version(), "Java " + System.getProperty("java.version")};
    }
}
