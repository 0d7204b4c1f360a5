package dev.cairn.cli;

import picocli.CommandLine;

/**
 * A comma-separated list of numbers given once as one option value (e.g. {@code --release X,Y,Z}), so that the usage
 * line shows the option as single-valued ({@code --release=X,Y,Z}) rather than as a repeatable list. Each number goes
 * through the strict number syntax of the command line ({@link CairnMain#strictDouble}); the count is checked by the
 * command ({@link TrajectoryCommand#vector}).
 *
 * @param values the numbers in order
 */
record NumberList(double[] values) {
    NumberList {
        values = values.clone();
    }

    @Override
    public double[] values() {
        return values.clone();
    }

    /** Picocli converter: splits at commas and parses every part strictly. */
    static final class Converter implements CommandLine.ITypeConverter<NumberList> {
        @Override
        public NumberList convert(String text) {
            String[] parts = text.split(",", -1);
            if (parts.length > 64) {
                throw new CommandLine.TypeConversionException("more than 64 comma-separated numbers");
            }
            double[] v = new double[parts.length];
            for (int i = 0; i < parts.length; i++) {
                v[i] = CairnMain.strictDouble(parts[i]);
            }
            return new NumberList(v);
        }
    }
}
