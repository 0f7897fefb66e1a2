using System.Globalization;
using System.Text;
using System.Text.Json;

namespace Patchproof.Core.Captures.Calibration;

/// <summary>Reads and writes the <c>patchproof-probe-calibration</c> file (JSON, version 1).</summary>
/// <remarks>
/// <para>Fields (docs/probe-calibration.md): <c>format</c>, <c>version</c>, <c>createdAt</c> (ISO 8601), <c>note</c>,
/// <c>referenceChannel</c>, <c>sampleCount</c>, <c>durationSeconds</c>, <c>sourceFiles</c>, and <c>channels</c>: one object
/// per channel with <c>channel</c>, <c>gain</c>, <c>gainSd</c>, <c>offsetVolts</c>, <c>offsetSdVolts</c>,
/// <c>correlation</c>, <c>residualRmsVolts</c>, <c>expectedResidualRmsVolts</c>, <c>quantizationStepVolts</c>.
/// Required: format, version, referenceChannel and, per channel, channel, gain and gainSd; the rest default to 0 or empty.</para>
/// <para>Absolute gains add two optional fields: <c>gainScale</c> (<c>relative</c>, the default, or <c>absolute</c>) and, for absolute gains,
/// <c>knownAmplitude</c>: <c>volts</c>, <c>relativeSd</c>, <c>highLevelVolts</c>, <c>lowLevelVolts</c>, <c>referenceGain</c>
/// and <c>referenceGainSd</c> (required), <c>measuredSdVolts</c> and <c>plateauSamples</c> (default 0). The channels' gains
/// stay relative to the reference, so the addition is compatible: an older reader warns that it ignored the two fields and
/// uses the relative gains, and a relative calibration is written exactly as before, without them.</para>
/// <para>Every error names the file, line and column; an unknown field is a warning (a misspelt <c>gainsd</c> would
/// otherwise pass silently). A file that fails to read changes nothing.</para>
/// </remarks>
public static class ProbeCalibrationFile
{
    private static readonly string[] TopFields = ["format", "version", "createdAt", "note", "referenceChannel", "sampleCount", "durationSeconds", "sourceFiles", "channels", "gainScale", "knownAmplitude"];
    private static readonly string[] AmplitudeFields = ["volts", "relativeSd", "highLevelVolts", "lowLevelVolts", "measuredSdVolts", "plateauSamples", "referenceGain", "referenceGainSd"];
    private static readonly string[] ChannelFields = ["channel", "gain", "gainSd", "offsetVolts", "offsetSdVolts", "correlation", "residualRmsVolts", "expectedResidualRmsVolts", "quantizationStepVolts"];

    /// <summary>The calibration as indented JSON.</summary>
    /// <param name="calibration">The calibration.</param>
    public static string Write(ProbeCalibration calibration)
    {
        ArgumentNullException.ThrowIfNull(calibration);
        using var stream = new MemoryStream();
        using (var writer = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true }))
        {
            writer.WriteStartObject();
            writer.WriteString("format", ProbeCalibration.FormatName);
            writer.WriteNumber("version", ProbeCalibration.FormatVersion);
            writer.WriteString("createdAt", calibration.CreatedAt.ToString("O", CultureInfo.InvariantCulture));
            writer.WriteString("note", calibration.Note);
            writer.WriteString("referenceChannel", calibration.ReferenceChannel);
            writer.WriteNumber("sampleCount", calibration.SampleCount);
            writer.WriteNumber("durationSeconds", calibration.DurationSeconds);
            if (calibration.Absolute is { } absolute)
            {
                writer.WriteString("gainScale", "absolute");
                writer.WriteStartObject("knownAmplitude");
                writer.WriteNumber("volts", absolute.KnownAmplitudeVolts);
                writer.WriteNumber("relativeSd", absolute.KnownAmplitudeRelativeSd);
                writer.WriteNumber("highLevelVolts", absolute.HighLevelVolts);
                writer.WriteNumber("lowLevelVolts", absolute.LowLevelVolts);
                writer.WriteNumber("measuredSdVolts", absolute.MeasuredAmplitudeSdVolts);
                writer.WriteNumber("plateauSamples", absolute.PlateauSampleCount);
                writer.WriteNumber("referenceGain", absolute.ReferenceGain);
                writer.WriteNumber("referenceGainSd", absolute.ReferenceGainSd);
                writer.WriteEndObject();
            }

            writer.WriteStartArray("sourceFiles");
            foreach (var file in calibration.SourceFiles)
            {
                writer.WriteStringValue(file);
            }

            writer.WriteEndArray();
            writer.WriteStartArray("channels");
            foreach (var channel in calibration.Channels)
            {
                writer.WriteStartObject();
                writer.WriteString("channel", channel.Channel);
                writer.WriteNumber("gain", channel.Gain);
                writer.WriteNumber("gainSd", channel.GainSd);
                writer.WriteNumber("offsetVolts", channel.OffsetVolts);
                writer.WriteNumber("offsetSdVolts", channel.OffsetSdVolts);
                writer.WriteNumber("correlation", channel.Correlation);
                writer.WriteNumber("residualRmsVolts", channel.ResidualRmsVolts);
                writer.WriteNumber("expectedResidualRmsVolts", channel.ExpectedResidualRmsVolts);
                writer.WriteNumber("quantizationStepVolts", channel.QuantizationStepVolts);
                writer.WriteEndObject();
            }

            writer.WriteEndArray();
            writer.WriteEndObject();
        }

        return Encoding.UTF8.GetString(stream.ToArray()) + "\n";
    }

    /// <summary>Reads a calibration file from disk.</summary>
    /// <param name="path">The file's path; also used in diagnostics.</param>
    /// <returns>The calibration, or errors with file, line and column.</returns>
    public static ParseResult<ProbeCalibration> ReadFile(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception exception) when (exception is IOException or UnauthorizedAccessException)
        {
            return ParseResult<ProbeCalibration>.ForError(SourceDiagnostic.ErrorAt(path, 0, 0, "cannot read the file: " + exception.Message));
        }

        return Read(bytes, path);
    }

    /// <summary>Reads a calibration from JSON text.</summary>
    /// <param name="json">The text.</param>
    /// <param name="fileName">The name to put in diagnostics, or null.</param>
    public static ParseResult<ProbeCalibration> Read(string json, string? fileName = null)
    {
        ArgumentNullException.ThrowIfNull(json);
        return Read(Encoding.UTF8.GetBytes(json), fileName);
    }

    /// <summary>Reads a calibration from UTF-8 bytes (a byte-order mark is allowed).</summary>
    /// <param name="utf8">The bytes.</param>
    /// <param name="fileName">The name to put in diagnostics, or null.</param>
    /// <returns>The calibration, or errors with file, line and column; unknown fields come back as warnings.</returns>
    public static ParseResult<ProbeCalibration> Read(byte[] utf8, string? fileName = null)
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
            var message = exception.Message.Split(". ")[0].TrimEnd('.');
            return ParseResult<ProbeCalibration>.ForError(SourceDiagnostic.ErrorAt(fileName, line, column, "not valid JSON: " + message));
        }

        using (document)
        {
            var session = new Session(fileName, JsonLocationMap.Build(utf8));
            var calibration = session.ReadCalibration(document.RootElement);
            return calibration is not null && session.Errors.Count == 0
                ? ParseResult<ProbeCalibration>.ForValue(calibration, session.Warnings)
                : ParseResult<ProbeCalibration>.ForErrors(session.Errors, session.Warnings);
        }
    }

    private sealed class Session(string? fileName, JsonLocationMap map)
    {
        public List<SourceDiagnostic> Errors { get; } = [];

        public List<SourceDiagnostic> Warnings { get; } = [];

        public ProbeCalibration? ReadCalibration(JsonElement root)
        {
            if (root.ValueKind is not JsonValueKind.Object)
            {
                Error("$", "expected a JSON object with \"format\": \"" + ProbeCalibration.FormatName + "\"");
                return null;
            }

            var format = String(root, "$", "format", required: true);
            if (format is not null && format != ProbeCalibration.FormatName)
            {
                Error("$.format", $"expected \"{ProbeCalibration.FormatName}\", found \"{format}\": this is not a probe calibration file");
                return null;
            }

            var version = Number(root, "$", "version", required: true);
            if (version is not null && version != ProbeCalibration.FormatVersion)
            {
                Error("$.version", string.Create(CultureInfo.InvariantCulture, $"version {version} is not supported; this program reads version {ProbeCalibration.FormatVersion}"));
                return null;
            }

            WarnUnknown(root, "$", TopFields);
            var absolute = ReadGainScale(root);

            var created = DateTimeOffset.MinValue;
            var createdText = String(root, "$", "createdAt", required: false);
            if (createdText is not null && !DateTimeOffset.TryParse(createdText, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal, out created))
            {
                Error("$.createdAt", $"expected an ISO 8601 time such as 2026-12-01T21:00:00Z, found \"{createdText}\"");
            }

            var note = String(root, "$", "note", required: false) ?? "";
            var reference = String(root, "$", "referenceChannel", required: true);
            var sampleCount = Number(root, "$", "sampleCount", required: false) ?? 0;
            if (sampleCount < 0 || sampleCount != Math.Floor(sampleCount) || sampleCount > int.MaxValue)
            {
                Error("$.sampleCount", "expected a whole number of samples, 0 or more");
            }

            var duration = Number(root, "$", "durationSeconds", required: false) ?? 0;
            if (duration < 0)
            {
                Error("$.durationSeconds", "expected a duration of 0 s or more");
            }

            var sources = new List<string>();
            if (root.TryGetProperty("sourceFiles", out var sourceArray))
            {
                if (sourceArray.ValueKind is not JsonValueKind.Array)
                {
                    Error("$.sourceFiles", "expected an array of file names");
                }
                else
                {
                    var index = 0;
                    foreach (var item in sourceArray.EnumerateArray())
                    {
                        if (item.ValueKind is JsonValueKind.String)
                        {
                            sources.Add(item.GetString()!);
                        }
                        else
                        {
                            Error($"$.sourceFiles[{index}]", "expected a file name (a string)");
                        }

                        index++;
                    }
                }
            }

            var channels = new List<ChannelCalibration>();
            if (!root.TryGetProperty("channels", out var channelArray) || channelArray.ValueKind is not JsonValueKind.Array || channelArray.GetArrayLength() == 0)
            {
                Error(root.TryGetProperty("channels", out _) ? "$.channels" : "$", "expected \"channels\": a non-empty array of channel objects");
            }
            else
            {
                var index = 0;
                foreach (var item in channelArray.EnumerateArray())
                {
                    var channel = ReadChannel(item, $"$.channels[{index}]");
                    if (channel is not null)
                    {
                        if (channels.Any(c => string.Equals(c.Channel, channel.Channel, StringComparison.OrdinalIgnoreCase)))
                        {
                            Error($"$.channels[{index}].channel", $"channel '{channel.Channel}' appears twice");
                        }

                        channels.Add(channel);
                    }

                    index++;
                }
            }

            if (reference is not null && Errors.Count == 0)
            {
                var referenceEntry = channels.FirstOrDefault(c => string.Equals(c.Channel, reference, StringComparison.OrdinalIgnoreCase));
                if (referenceEntry is null)
                {
                    Error("$.referenceChannel", $"the reference channel '{reference}' is not among the channels ({string.Join(", ", channels.Select(c => c.Channel))})");
                }
                else if (referenceEntry.Gain != 1 || referenceEntry.GainSd != 0)
                {
                    Error($"$.channels[{channels.IndexOf(referenceEntry)}].gain", "the reference channel must have gain 1 and gainSd 0: the others are measured against it");
                }
            }

            return Errors.Count > 0 || reference is null
                ? null
                : new ProbeCalibration(reference, channels, (int)sampleCount, duration, sources, created, note) { Absolute = absolute };
        }

        /// <summary><c>gainScale</c> (default relative) and, for absolute gains, <c>knownAmplitude</c>; null for relative gains or on an error.</summary>
        private KnownAmplitudeReference? ReadGainScale(JsonElement root)
        {
            var scale = String(root, "$", "gainScale", required: false) ?? "relative";
            if (scale == "relative")
            {
                if (root.TryGetProperty("knownAmplitude", out _))
                {
                    Error("$.knownAmplitude", "\"knownAmplitude\" belongs to absolute gains; this file's gains are relative (\"gainScale\" is missing or \"relative\")");
                }

                return null;
            }

            if (scale != "absolute")
            {
                Error("$.gainScale", $"expected \"relative\" or \"absolute\", found \"{scale}\"");
                return null;
            }

            if (!root.TryGetProperty("knownAmplitude", out var item) || item.ValueKind is not JsonValueKind.Object)
            {
                Error(root.TryGetProperty("knownAmplitude", out _) ? "$.knownAmplitude" : "$", "absolute gains need \"knownAmplitude\": an object with \"volts\", \"relativeSd\", \"highLevelVolts\", \"lowLevelVolts\", \"referenceGain\" and \"referenceGainSd\"");
                return null;
            }

            const string path = "$.knownAmplitude";
            WarnUnknown(item, path, AmplitudeFields);
            var volts = Number(item, path, "volts", required: true);
            if (volts is <= 0)
            {
                Error(path + ".volts", "expected the known peak-to-peak amplitude: a positive number of volts");
            }

            var relativeSd = NonNegative(item, path, "relativeSd", required: true);
            if (relativeSd is >= 1)
            {
                Error(path + ".relativeSd", "expected the amplitude's relative accuracy as a fraction below 1, for example 0.001 for 0.1 %");
            }

            var high = Number(item, path, "highLevelVolts", required: true);
            var low = Number(item, path, "lowLevelVolts", required: true);
            if (high is not null && low is not null && !(high > low))
            {
                Error(path + ".highLevelVolts", "the high level must lie above the low level");
            }

            var measuredSd = NonNegative(item, path, "measuredSdVolts", required: false) ?? 0;
            var plateaus = Number(item, path, "plateauSamples", required: false) ?? 0;
            if (plateaus < 0 || plateaus != Math.Floor(plateaus) || plateaus > int.MaxValue)
            {
                Error(path + ".plateauSamples", "expected a whole number of samples, 0 or more");
            }

            var gain = Number(item, path, "referenceGain", required: true);
            if (gain is <= 0)
            {
                Error(path + ".referenceGain", "expected a positive gain (the reference channel's reading per volt at the probe tip)");
            }

            var gainSd = NonNegative(item, path, "referenceGainSd", required: true);
            if (gain is > 0 && relativeSd is >= 0 and < 1 && gainSd is not null && gainSd < gain * relativeSd * (1 - 1e-9))
            {
                Error(path + ".referenceGainSd", "the reference gain's sd is smaller than the amplitude's own accuracy allows (referenceGain · relativeSd)");
            }

            return volts is null || relativeSd is null || gain is null || gainSd is null || high is null || low is null
                ? null
                : new KnownAmplitudeReference(volts.Value, relativeSd.Value, high.Value, low.Value, measuredSd, (int)Math.Max(0, Math.Min(plateaus, int.MaxValue)), gain.Value, gainSd.Value);
        }

        private ChannelCalibration? ReadChannel(JsonElement item, string path)
        {
            if (item.ValueKind is not JsonValueKind.Object)
            {
                Error(path, "expected a channel object with \"channel\", \"gain\" and \"gainSd\"");
                return null;
            }

            WarnUnknown(item, path, ChannelFields);
            var name = String(item, path, "channel", required: true);
            if (name is not null && name.Trim().Length == 0)
            {
                Error(path + ".channel", "the channel name is empty");
            }

            var gain = Number(item, path, "gain", required: true);
            if (gain is <= 0)
            {
                Error(path + ".gain", "expected a positive gain (the channel's reading per volt of the reference's)");
            }

            var gainSd = NonNegative(item, path, "gainSd", required: true);
            var offset = Number(item, path, "offsetVolts", required: false) ?? 0;
            var offsetSd = NonNegative(item, path, "offsetSdVolts", required: false) ?? 0;
            var correlation = Number(item, path, "correlation", required: false) ?? 0;
            if (correlation is < -1 or > 1)
            {
                Error(path + ".correlation", "expected a correlation between -1 and 1");
            }

            var residual = NonNegative(item, path, "residualRmsVolts", required: false) ?? 0;
            var expected = NonNegative(item, path, "expectedResidualRmsVolts", required: false) ?? 0;
            var step = NonNegative(item, path, "quantizationStepVolts", required: false) ?? 0;
            return name is null || gain is null || gainSd is null
                ? null
                : new ChannelCalibration(name.Trim(), gain.Value, gainSd.Value, offset, offsetSd, correlation, residual, expected, step);
        }

        private double? NonNegative(JsonElement item, string path, string field, bool required)
        {
            var value = Number(item, path, field, required);
            if (value is < 0)
            {
                Error($"{path}.{field}", "expected a value of 0 or more");
                return null;
            }

            return value;
        }

        private string? String(JsonElement item, string path, string field, bool required)
        {
            if (!item.TryGetProperty(field, out var value))
            {
                if (required)
                {
                    Error(path, $"the field \"{field}\" is missing");
                }

                return null;
            }

            if (value.ValueKind is not JsonValueKind.String)
            {
                Error($"{path}.{field}", $"expected \"{field}\" to be a string, found {Describe(value)}");
                return null;
            }

            return value.GetString();
        }

        private double? Number(JsonElement item, string path, string field, bool required)
        {
            if (!item.TryGetProperty(field, out var value))
            {
                if (required)
                {
                    Error(path, $"the field \"{field}\" is missing");
                }

                return null;
            }

            if (value.ValueKind is not JsonValueKind.Number || !value.TryGetDouble(out var number) || !double.IsFinite(number))
            {
                Error($"{path}.{field}", $"expected \"{field}\" to be a finite number, found {Describe(value)}");
                return null;
            }

            return number;
        }

        private void WarnUnknown(JsonElement item, string path, string[] known)
        {
            foreach (var property in item.EnumerateObject().Where(p => !known.Contains(p.Name, StringComparer.Ordinal)))
            {
                var (line, column) = map.Find($"{path}.{property.Name}");
                Warnings.Add(SourceDiagnostic.WarningAt(fileName, line, column, $"unknown field \"{property.Name}\" was ignored (known: {string.Join(", ", known)})"));
            }
        }

        private void Error(string path, string message)
        {
            var (line, column) = map.Find(path);
            Errors.Add(SourceDiagnostic.ErrorAt(fileName, line, column, message));
        }

        private static string Describe(JsonElement value) => value.ValueKind switch
        {
            JsonValueKind.String => $"the string \"{value.GetString()}\"",
            JsonValueKind.Number => $"the number {value.GetRawText()}",
            JsonValueKind.True or JsonValueKind.False => value.GetRawText(),
            JsonValueKind.Null => "null",
            JsonValueKind.Array => "an array",
            _ => "an object",
        };
    }
}
