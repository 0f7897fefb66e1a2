using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;

namespace Patchproof.Core.Circuits.Files;

/// <summary>Writes a <see cref="BoardDesign"/> as a design file (version 1) that <see cref="DesignFileReader"/> reads back.</summary>
/// <remarks>Values are written with SI prefixes and unit symbols (<c>10 kΩ</c>, <c>10 nF</c>), six
/// significant digits; Ω and µ are written as characters, not escapes, so the file reads well.</remarks>
public static class DesignFileWriter
{
    /// <summary>The design as indented JSON text.</summary>
    /// <param name="design">The design.</param>
    /// <returns>The file's text, ending with a newline.</returns>
    public static string Write(BoardDesign design)
    {
        ArgumentNullException.ThrowIfNull(design);
        using var stream = new MemoryStream();
        using (var writer = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping }))
        {
            writer.WriteStartObject();
            writer.WriteString("format", DesignFile.FormatName);
            writer.WriteNumber("version", DesignFile.CurrentVersion);
            if (design.Board.Length > 0)
            {
                writer.WriteString("board", design.Board);
            }

            if (design.Title.Length > 0)
            {
                writer.WriteString("title", design.Title);
            }
            if (design.Description.Length > 0)
            {
                writer.WriteString("description", design.Description);
            }

            if (design.Model is { } model)
            {
                writer.WriteStartObject("model");
                writer.WriteString("name", model.Name);
                if (model.Parameters.Count > 0)
                {
                    writer.WriteStartObject("parameters");
                    foreach (var (name, value) in model.Parameters.OrderBy(pair => pair.Key, StringComparer.Ordinal))
                    {
                        writer.WriteNumber(name, value);
                    }

                    writer.WriteEndObject();
                }

                writer.WriteEndObject();
            }

            writer.WriteString("timeScale", ValueNotation.Format(design.TimeScaleSeconds, Quantity.Time));
            writer.WriteString("outputLimit", ValueNotation.Format(design.OutputLimitVolts, Quantity.Voltage));
            writer.WriteString("machineUnit", ValueNotation.Format(design.MachineUnitVolts, Quantity.Voltage));

            writer.WriteStartArray("variables");
            foreach (var variable in design.Variables)
            {
                writer.WriteStartObject();
                writer.WriteString("name", variable.Name);
                writer.WriteString("scale", variable.ScaleVoltsPerUnit.ToString("G6", CultureInfo.InvariantCulture) + " V");
                writer.WriteString("sign", variable.Sign < 0 ? "-" : "+");
                writer.WriteEndObject();
            }

            writer.WriteEndArray();

            writer.WriteStartArray("parts");
            foreach (var part in design.Parts)
            {
                writer.WriteStartObject();
                writer.WriteString("id", part.Id);
                writer.WriteString("kind", part.Kind.ToString().ToLowerInvariant());
                writer.WriteString("value", part.NominalText);
                writer.WriteString("tolerance", ValueNotation.Format(part.Tolerance, Quantity.Fraction));
                if (part.Series is not null)
                {
                    writer.WriteString("series", part.Series.Name);
                }

                writer.WriteEndObject();
            }

            writer.WriteEndArray();

            writer.WriteStartArray("blocks");
            foreach (var block in design.Blocks)
            {
                WriteBlock(writer, block);
            }

            writer.WriteEndArray();
            writer.WriteEndObject();
        }

        return Encoding.UTF8.GetString(stream.ToArray()) + "\n";
    }

    private static void WriteBlock(Utf8JsonWriter writer, DesignBlock block)
    {
        writer.WriteStartObject();
        switch (block)
        {
            case IntegratorBlock integrator:
                writer.WriteString("kind", "integrator");
                writer.WriteString("output", integrator.Variable);
                writer.WriteString("capacitor", integrator.CapacitorId);
                if (integrator.InitialVolts is { } initial)
                {
                    writer.WriteString("initial", ValueNotation.Format(initial, Quantity.Voltage));
                }

                WriteInputs(writer, integrator.Inputs);
                break;
            case SummerBlock summer:
                writer.WriteString("kind", summer.IsInverter ? "inverter" : "summer");
                writer.WriteString("output", summer.Output);
                writer.WriteString("feedback", summer.FeedbackResistorId);
                WriteInputs(writer, summer.Inputs);
                break;
            case MultiplierBlock multiplier:
                writer.WriteString("kind", "multiplier");
                writer.WriteString("output", multiplier.Output);
                writer.WriteString("part", multiplier.PartId);
                writer.WriteString("x", multiplier.X);
                writer.WriteString("y", multiplier.Y);
                break;
            case ReferenceBlock reference:
                writer.WriteString("kind", "reference");
                writer.WriteString("output", reference.Output);
                writer.WriteString("part", reference.PartId);
                break;
            case FunctionBlock function:
                writer.WriteString("kind", "function");
                writer.WriteString("output", function.Output);
                writer.WriteString("input", function.Input);
                writer.WriteStartArray("points");
                foreach (var point in function.Points)
                {
                    writer.WriteStartArray();
                    writer.WriteStringValue(ValueNotation.Format(point.InputVolts, Quantity.Voltage));
                    writer.WriteStringValue(ValueNotation.Format(point.OutputVolts, Quantity.Voltage));
                    writer.WriteEndArray();
                }

                writer.WriteEndArray();
                break;
        }

        writer.WriteEndObject();
    }

    private static void WriteInputs(Utf8JsonWriter writer, System.Collections.Immutable.ImmutableArray<BlockInput> inputs)
    {
        writer.WriteStartArray("inputs");
        foreach (var input in inputs)
        {
            writer.WriteStartObject();
            writer.WriteString("from", input.From);
            writer.WriteString("resistor", input.ResistorId);
            writer.WriteEndObject();
        }

        writer.WriteEndArray();
    }
}
