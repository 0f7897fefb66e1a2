using System.Runtime.InteropServices;
using Patchproof.Core.Captures;

namespace Patchproof.Server.Storage;

/// <summary>The parsed samples of a capture in a compact binary file, so a fit does not parse the CSV again.</summary>
/// <remarks>
/// Layout (little-endian): the 8 bytes <c>PPSMPL01</c>; channel count and sample count (int32);
/// time base kind (byte: 0 uniform, 1 explicit) and, when uniform, start and interval in seconds
/// (float64); per channel its name and unit (length-prefixed UTF-8), source column (int32) and probe
/// factor (float64); when explicit, one float64 time per sample; then each channel's samples as
/// float32 in volts. Metadata stays in the CSV, which is kept as received.
/// </remarks>
internal static class CaptureSamplesFile
{
    private static readonly byte[] Magic = "PPSMPL01"u8.ToArray();

    public static void Write(string path, Capture capture)
    {
        using var stream = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.None, 1 << 16);
        using var writer = new BinaryWriter(stream);
        writer.Write(Magic);
        writer.Write(capture.Channels.Count);
        writer.Write(capture.SampleCount);
        if (capture.TimeBase is UniformTimeBase uniform)
        {
            writer.Write((byte)0);
            writer.Write(uniform.StartSeconds);
            writer.Write(uniform.IntervalSeconds);
        }
        else
        {
            writer.Write((byte)1);
        }

        foreach (var channel in capture.Channels)
        {
            writer.Write(channel.Name);
            writer.Write(channel.Unit);
            writer.Write(channel.SourceColumn);
            writer.Write(channel.ProbeFactor);
        }

        if (capture.TimeBase is ExplicitTimeBase explicitTimes)
        {
            writer.Write(MemoryMarshal.AsBytes(explicitTimes.TimesSeconds.Span));
        }

        foreach (var channel in capture.Channels)
        {
            writer.Write(MemoryMarshal.AsBytes(channel.Samples.Span));
        }

        writer.Flush();
        stream.Flush(flushToDisk: true);
    }

    public static Capture Read(string path, string? sourceFile)
    {
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16);
        using var reader = new BinaryReader(stream);
        if (!reader.ReadBytes(Magic.Length).AsSpan().SequenceEqual(Magic))
        {
            throw new InvalidDataException($"{path} is not a samples file.");
        }

        var channelCount = reader.ReadInt32();
        var sampleCount = reader.ReadInt32();
        var kind = reader.ReadByte();
        var (start, interval) = kind == 0 ? (reader.ReadDouble(), reader.ReadDouble()) : (0.0, 0.0);
        var headers = Enumerable.Range(0, channelCount)
            .Select(_ => (Name: reader.ReadString(), Unit: reader.ReadString(), Column: reader.ReadInt32(), Probe: reader.ReadDouble()))
            .ToList();
        TimeBase timeBase;
        if (kind == 0)
        {
            timeBase = new UniformTimeBase(start, interval, sampleCount);
        }
        else
        {
            var times = new double[sampleCount];
            stream.ReadExactly(MemoryMarshal.AsBytes(times.AsSpan()));
            timeBase = new ExplicitTimeBase(times);
        }

        var channels = headers.Select(header =>
        {
            var samples = new float[sampleCount];
            stream.ReadExactly(MemoryMarshal.AsBytes(samples.AsSpan()));
            return new CaptureChannel(header.Name, header.Unit, samples, sourceFile, header.Column, header.Probe);
        }).ToList();
        return new Capture(timeBase, channels, []);
    }
}
