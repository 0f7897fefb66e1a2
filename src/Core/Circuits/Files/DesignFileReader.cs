using System.Collections.Immutable;
using System.Text;
using System.Text.Json;

namespace Patchproof.Core.Circuits.Files;

/// <summary>Reads a design file (JSON, <c>"format": "patchproof-design"</c>, version 1) into a <see cref="BoardDesign"/>.</summary>
/// <remarks>
/// <para>The schema is documented in docs/circuits.md. Values are written as people write them
/// (<see cref="ValueNotation"/>). Every error names the JSON path and, where the text holds it, the
/// line and column; nothing is guessed. Unknown fields are reported as warnings (a typo such as
/// <c>capcitor</c> would otherwise pass silently); an unknown block kind is an error.</para>
/// </remarks>
public static class DesignFileReader
{
    private static readonly string[] TopFields = ["format", "version", "board", "title", "description", "model", "timeScale", "outputLimit", "machineUnit", "variables", "parts", "blocks"];
    private static readonly string[] VariableFields = ["name", "scale", "sign"];
    private static readonly string[] PartFields = ["id", "kind", "value", "tolerance", "series", "note"];
    private static readonly string[] InputFields = ["from", "resistor"];

    /// <summary>Reads a design file from disk.</summary>
    /// <param name="path">The file's path; also used in diagnostics.</param>
    /// <returns>The design, or errors with file, line and column.</returns>
    public static ParseResult<BoardDesign> ReadFile(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception exception) when (exception is IOException or UnauthorizedAccessException)
        {
            return ParseResult<BoardDesign>.ForError(SourceDiagnostic.ErrorAt(path, 0, 0, "cannot read the file: " + exception.Message));
        }

        return Read(bytes, path);
    }

    /// <summary>Reads a design from JSON text.</summary>
    /// <param name="json">The text.</param>
    /// <param name="fileName">The name to put in diagnostics, or null.</param>
    /// <returns>The design, or errors.</returns>
    public static ParseResult<BoardDesign> Read(string json, string? fileName = null)
    {
        ArgumentNullException.ThrowIfNull(json);
        return Read(Encoding.UTF8.GetBytes(json), fileName);
    }

    /// <summary>Reads a design from UTF-8 bytes.</summary>
    /// <param name="utf8">The bytes (a byte-order mark is allowed).</param>
    /// <param name="fileName">The name to put in diagnostics, or null.</param>
    /// <returns>The design, or errors.</returns>
    public static ParseResult<BoardDesign> Read(byte[] utf8, string? fileName = null)
    {
        ArgumentNullException.ThrowIfNull(utf8);
        if (utf8.Length >= 3 && utf8[0] == 0xEF && utf8[1] == 0xBB && utf8[2] == 0xBF)
        {
            utf8 = utf8[3..];
        }

        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(utf8, new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        }
        catch (JsonException exception)
        {
            var line = (int)(exception.LineNumber ?? -1) + 1;
            var column = (int)(exception.BytePositionInLine ?? -1) + 1;
            return ParseResult<BoardDesign>.ForError(SourceDiagnostic.ErrorAt(fileName, line, column, "not valid JSON: " + FirstSentence(exception.Message)));
        }

        using (document)
        {
            var session = new Session(fileName, JsonLocationMap.Build(utf8));
            var design = session.ReadDesign(document.RootElement);
            if (design is not null && session.Errors.Count == 0)
            {
                foreach (var problem in DesignValidator.Validate(design))
                {
                    session.Error(problem.Path, problem.Message);
                }
            }

            return session.Errors.Count > 0 || design is null
                ? ParseResult<BoardDesign>.ForErrors(session.Errors, session.Warnings)
                : ParseResult<BoardDesign>.ForValue(design, session.Warnings);
        }
    }

    private static string FirstSentence(string message)
    {
        var cut = message.IndexOf(" Path:", StringComparison.Ordinal);
        return cut > 0 ? message[..cut] : message;
    }

    private sealed class Session(string? fileName, JsonLocationMap map)
    {
        public List<SourceDiagnostic> Errors { get; } = [];

        public List<SourceDiagnostic> Warnings { get; } = [];

        public void Error(string path, string message)
        {
            var (line, column) = map.Find(path);
            Errors.Add(SourceDiagnostic.ErrorAt(fileName, line, column, $"{path}: {message}"));
        }

        public void Warning(string path, string message)
        {
            var (line, column) = map.Find(path);
            Warnings.Add(SourceDiagnostic.WarningAt(fileName, line, column, $"{path}: {message}"));
        }

        public BoardDesign? ReadDesign(JsonElement root)
        {
            if (root.ValueKind != JsonValueKind.Object)
            {
                Error("$", "a design file is a JSON object with \"format\": \"patchproof-design\"");
                return null;
            }

            WarnUnknown(root, "$", TopFields);
            var format = String(root, "$", "format", required: true);
            if (format is not null && format != DesignFile.FormatName)
            {
                Error("$.format", $"is '{format}'; a design file says \"format\": \"{DesignFile.FormatName}\"");
                return null;
            }

            if (!root.TryGetProperty("version", out var version) || version.ValueKind != JsonValueKind.Number || !version.TryGetInt32(out var number))
            {
                Error("$.version", $"needs the format version as a number ({DesignFile.CurrentVersion})");
                return null;
            }

            if (number != DesignFile.CurrentVersion)
            {
                Error("$.version", $"version {number} is not supported; this program reads version {DesignFile.CurrentVersion}");
                return null;
            }

            var board = String(root, "$", "board", required: false) ?? string.Empty;
            var title = String(root, "$", "title", required: false) ?? string.Empty;
            var description = String(root, "$", "description", required: false) ?? string.Empty;
            var model = ReadModel(root);
            var timeScale = Value(root, "$", "timeScale", Quantity.Time, required: true) ?? double.NaN;
            var outputLimit = Value(root, "$", "outputLimit", Quantity.Voltage, required: false) ?? BoardDesign.DefaultOutputLimitVolts;
            var machineUnit = Value(root, "$", "machineUnit", Quantity.Voltage, required: false) ?? BoardDesign.DefaultMachineUnitVolts;
            var variables = ReadArray(root, "variables", ReadVariable);
            var parts = ReadArray(root, "parts", ReadPart);
            var blocks = ReadArray(root, "blocks", ReadBlock);
            if (Errors.Count > 0)
            {
                return null;
            }

            return new BoardDesign(board, title, model, timeScale, variables, parts, blocks)
            {
                Description = description,
                OutputLimitVolts = outputLimit,
                MachineUnitVolts = machineUnit,
            };
        }

        private ModelReference? ReadModel(JsonElement root)
        {
            if (!root.TryGetProperty("model", out var model) || model.ValueKind == JsonValueKind.Null)
            {
                return null;
            }

            if (model.ValueKind == JsonValueKind.String)
            {
                return ModelReference.Of(model.GetString()!);
            }

            if (model.ValueKind != JsonValueKind.Object)
            {
                Error("$.model", "is a model name or an object with \"name\" and \"parameters\"");
                return null;
            }

            WarnUnknown(model, "$.model", ["name", "parameters"]);
            var name = String(model, "$.model", "name", required: true);
            var parameters = ImmutableDictionary.CreateBuilder<string, double>(StringComparer.Ordinal);
            if (model.TryGetProperty("parameters", out var values))
            {
                if (values.ValueKind != JsonValueKind.Object)
                {
                    Error("$.model.parameters", "is an object of parameter values, for example { \"rho\": 28 }");
                }
                else
                {
                    foreach (var property in values.EnumerateObject())
                    {
                        if (property.Value.ValueKind == JsonValueKind.Number)
                        {
                            parameters[property.Name] = property.Value.GetDouble();
                        }
                        else
                        {
                            Error($"$.model.parameters.{property.Name}", "must be a number");
                        }
                    }
                }
            }

            return name is null ? null : new ModelReference(name, parameters.ToImmutable());
        }

        private ImmutableArray<T> ReadArray<T>(JsonElement root, string field, Func<JsonElement, string, T?> readItem)
            where T : class
        {
            var path = "$." + field;
            if (!root.TryGetProperty(field, out var array))
            {
                Error("$", $"needs a \"{field}\" list");
                return [];
            }

            if (array.ValueKind != JsonValueKind.Array)
            {
                Error(path, "must be a list");
                return [];
            }

            var items = ImmutableArray.CreateBuilder<T>();
            var index = 0;
            foreach (var element in array.EnumerateArray())
            {
                var itemPath = $"{path}[{index++}]";
                if (element.ValueKind != JsonValueKind.Object)
                {
                    Error(itemPath, "must be an object");
                    continue;
                }

                if (readItem(element, itemPath) is { } item)
                {
                    items.Add(item);
                }
            }

            return items.ToImmutable();
        }

        private DesignVariable? ReadVariable(JsonElement element, string path)
        {
            WarnUnknown(element, path, VariableFields);
            var name = String(element, path, "name", required: true);
            var scale = Value(element, path, "scale", Quantity.VoltsPerUnit, required: true);
            var sign = 1;
            if (element.TryGetProperty("sign", out var signElement))
            {
                var text = signElement.ValueKind == JsonValueKind.Number ? signElement.GetRawText() : signElement.ValueKind == JsonValueKind.String ? signElement.GetString() : null;
                switch (text?.Trim())
                {
                    case "+" or "+1" or "1":
                        sign = 1;
                        break;
                    case "-" or "-1":
                        sign = -1;
                        break;
                    default:
                        Error(path + ".sign", "must be \"+\" or \"-\"");
                        break;
                }
            }

            return name is null || scale is null ? null : new DesignVariable(name, scale.Value, sign);
        }

        private Part? ReadPart(JsonElement element, string path)
        {
            WarnUnknown(element, path, PartFields);
            var id = String(element, path, "id", required: true);
            if (id is null)
            {
                return null;
            }

            var kindText = String(element, path, "kind", required: false);
            PartKind kind;
            if (kindText is null)
            {
                if (!TryKindFromId(id, out kind))
                {
                    Error(path, $"part '{id}' needs a \"kind\": resistor, capacitor, multiplier or reference");
                    return null;
                }
            }
            else if (!TryKind(kindText, out kind))
            {
                Error(path + ".kind", $"unknown part kind '{kindText}'; use resistor, capacitor, multiplier or reference");
                return null;
            }

            var quantity = kind switch
            {
                PartKind.Resistor => Quantity.Resistance,
                PartKind.Capacitor => Quantity.Capacitance,
                PartKind.Multiplier => Quantity.PerVolt,
                _ => Quantity.Voltage,
            };
            var value = Value(element, path, "value", quantity, required: true);
            ESeries? series = null;
            var seriesText = String(element, path, "series", required: false);
            if (seriesText is not null && !ESeries.TryFind(seriesText, out series))
            {
                Error(path + ".series", $"unknown series '{seriesText}'; use E6, E12, E24, E48 or E96");
            }

            var tolerance = Value(element, path, "tolerance", Quantity.Fraction, required: false);
            if (tolerance is null)
            {
                if (series is null)
                {
                    Error(path, $"part '{id}' needs a \"tolerance\" (such as \"1 %\") or a \"series\" (such as \"E96\")");
                    return null;
                }

                tolerance = series.Tolerance;
            }

            if (value is not null && series is not null && kind is PartKind.Resistor or PartKind.Capacitor && !series.Contains(value.Value))
            {
                Warning(path + ".value", $"{ValueNotation.Format(value.Value, quantity)} is not an {series.Name} value (nearest: {ValueNotation.Format(series.Nearest(value.Value), quantity)})");
            }

            return value is null ? null : new Part(id, kind, value.Value, tolerance.Value, series);
        }

        private DesignBlock? ReadBlock(JsonElement element, string path)
        {
            var kind = String(element, path, "kind", required: true);
            var output = String(element, path, "output", required: true);
            if (kind is null || output is null)
            {
                return null;
            }

            switch (kind.Trim().ToLowerInvariant())
            {
                case "integrator":
                    WarnUnknown(element, path, ["kind", "output", "capacitor", "inputs", "initial", "label"]);
                    var capacitor = String(element, path, "capacitor", required: false);
                    if (capacitor is null)
                    {
                        Error(path + ".capacitor", $"the integrator for '{output}' has no capacitor; name its capacitor part, for example \"capacitor\": \"C1\"");
                    }

                    var initial = Value(element, path, "initial", Quantity.Voltage, required: false);
                    return new IntegratorBlock(output, capacitor ?? string.Empty, ReadInputs(element, path, required: false), initial);
                case "summer":
                case "inverter":
                    WarnUnknown(element, path, ["kind", "output", "feedback", "inputs", "label"]);
                    var feedback = String(element, path, "feedback", required: false);
                    if (feedback is null)
                    {
                        Error(path + ".feedback", $"the {kind} driving '{output}' has no feedback resistor; name it, for example \"feedback\": \"R20\"");
                    }

                    var inputs = ReadInputs(element, path, required: true);
                    if (kind == "inverter" && inputs.Length > 1)
                    {
                        Error(path + ".inputs", "an inverter has one input; use \"kind\": \"summer\" for several");
                    }

                    return new SummerBlock(output, feedback ?? string.Empty, inputs);
                case "multiplier":
                    WarnUnknown(element, path, ["kind", "output", "part", "x", "y", "label"]);
                    var multiplierPart = String(element, path, "part", required: true);
                    var x = String(element, path, "x", required: true);
                    var y = String(element, path, "y", required: true);
                    return multiplierPart is null || x is null || y is null ? null : new MultiplierBlock(output, multiplierPart, x, y);
                case "reference":
                    WarnUnknown(element, path, ["kind", "output", "part", "label"]);
                    var referencePart = String(element, path, "part", required: true);
                    return referencePart is null ? null : new ReferenceBlock(output, referencePart);
                case "function":
                    WarnUnknown(element, path, ["kind", "output", "input", "points", "label"]);
                    var input = String(element, path, "input", required: true);
                    var points = ReadPoints(element, path);
                    return input is null ? null : new FunctionBlock(output, input, points);
                default:
                    Error(path + ".kind", $"unknown block '{kind}'; a block is an integrator, summer, inverter, multiplier, reference or function");
                    return null;
            }
        }

        private ImmutableArray<BlockInput> ReadInputs(JsonElement element, string path, bool required)
        {
            if (!element.TryGetProperty("inputs", out var array))
            {
                if (required)
                {
                    Error(path, "needs an \"inputs\" list");
                }

                return [];
            }

            if (array.ValueKind != JsonValueKind.Array)
            {
                Error(path + ".inputs", "must be a list of { \"from\": ..., \"resistor\": ... }");
                return [];
            }

            var inputs = ImmutableArray.CreateBuilder<BlockInput>();
            var index = 0;
            foreach (var item in array.EnumerateArray())
            {
                var itemPath = $"{path}.inputs[{index++}]";
                if (item.ValueKind != JsonValueKind.Object)
                {
                    Error(itemPath, "must be an object { \"from\": ..., \"resistor\": ... }");
                    continue;
                }

                WarnUnknown(item, itemPath, InputFields);
                var from = String(item, itemPath, "from", required: true);
                var resistor = String(item, itemPath, "resistor", required: false);
                if (resistor is null)
                {
                    Error(itemPath + ".resistor", $"the input from '{from}' has no resistor; name its part, for example \"resistor\": \"R1\"");
                }

                if (from is not null)
                {
                    inputs.Add(new BlockInput(from, resistor ?? string.Empty));
                }
            }

            return inputs.ToImmutable();
        }

        private ImmutableArray<FunctionPoint> ReadPoints(JsonElement element, string path)
        {
            if (!element.TryGetProperty("points", out var array) || array.ValueKind != JsonValueKind.Array)
            {
                Error(path + ".points", "needs a list of corners [input, output], for example [[\"-10 V\", \"-2 V\"], [\"0 V\", \"0 V\"]]");
                return [];
            }

            var points = ImmutableArray.CreateBuilder<FunctionPoint>();
            var index = 0;
            foreach (var item in array.EnumerateArray())
            {
                var itemPath = $"{path}.points[{index++}]";
                if (item.ValueKind != JsonValueKind.Array || item.GetArrayLength() != 2)
                {
                    Error(itemPath, "a corner is a pair [input voltage, output voltage]");
                    continue;
                }

                var input = ElementValue(item[0], itemPath + "[0]", Quantity.Voltage);
                var output = ElementValue(item[1], itemPath + "[1]", Quantity.Voltage);
                if (input is not null && output is not null)
                {
                    points.Add(new FunctionPoint(input.Value, output.Value));
                }
            }

            return points.ToImmutable();
        }

        private string? String(JsonElement element, string path, string field, bool required)
        {
            if (!element.TryGetProperty(field, out var value) || value.ValueKind == JsonValueKind.Null)
            {
                if (required)
                {
                    Error(path + "." + field, $"is missing; \"{field}\" is required here");
                }

                return null;
            }

            if (value.ValueKind != JsonValueKind.String)
            {
                Error(path + "." + field, "must be a string");
                return null;
            }

            var text = value.GetString()!.Trim();
            if (text.Length == 0)
            {
                Error(path + "." + field, "is empty");
                return null;
            }

            return text;
        }

        private double? Value(JsonElement element, string path, string field, Quantity quantity, bool required)
        {
            if (!element.TryGetProperty(field, out var value) || value.ValueKind == JsonValueKind.Null)
            {
                if (required)
                {
                    Error(path + "." + field, $"is missing; \"{field}\" is required here");
                }

                return null;
            }

            return ElementValue(value, path + "." + field, quantity);
        }

        private double? ElementValue(JsonElement value, string path, Quantity quantity)
        {
            string? text = value.ValueKind switch
            {
                JsonValueKind.String => value.GetString(),
                JsonValueKind.Number => value.GetRawText(),
                _ => null,
            };
            if (text is null)
            {
                Error(path, "must be a value such as \"10 kΩ\" or a number");
                return null;
            }

            if (!ValueNotation.TryParse(text, quantity, out var parsed, out var message))
            {
                Error(path, message!);
                return null;
            }

            return parsed;
        }

        private void WarnUnknown(JsonElement element, string path, string[] known)
        {
            foreach (var property in element.EnumerateObject())
            {
                if (!known.Contains(property.Name, StringComparer.Ordinal))
                {
                    Warning($"{path}.{property.Name}", $"unknown field '{property.Name}' is ignored (known here: {string.Join(", ", known)})");
                }
            }
        }

        private static bool TryKind(string text, out PartKind kind)
        {
            switch (text.Trim().ToLowerInvariant())
            {
                case "resistor":
                    kind = PartKind.Resistor;
                    return true;
                case "capacitor":
                    kind = PartKind.Capacitor;
                    return true;
                case "multiplier":
                    kind = PartKind.Multiplier;
                    return true;
                case "reference":
                    kind = PartKind.Reference;
                    return true;
                default:
                    kind = default;
                    return false;
            }
        }

        private static bool TryKindFromId(string id, out PartKind kind)
        {
            kind = id.StartsWith("VR", StringComparison.OrdinalIgnoreCase) ? PartKind.Reference
                : id.StartsWith('R') ? PartKind.Resistor
                : id.StartsWith('C') ? PartKind.Capacitor
                : id.StartsWith('M') ? PartKind.Multiplier
                : (PartKind)(-1);
            return Enum.IsDefined(kind);
        }
    }
}
