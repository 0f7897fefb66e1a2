using System.Text;
using System.Text.Json;

namespace Patchproof.Core;

/// <summary>Maps JSON paths (<c>$.blocks[2].inputs[0].from</c>) to the line and column where their value starts.</summary>
/// <remarks>Built by one pass of <see cref="Utf8JsonReader"/> over the text; lines and columns count
/// from 1, columns in characters (not bytes). A path that is not in the text (a missing field) maps to
/// its nearest enclosing object.</remarks>
internal sealed class JsonLocationMap
{
    private readonly Dictionary<string, (int Line, int Column)> locations = new(StringComparer.Ordinal);

    private JsonLocationMap()
    {
    }

    public static JsonLocationMap Build(byte[] utf8)
    {
        var map = new JsonLocationMap();
        var lineStarts = new List<int> { 0 };
        for (var i = 0; i < utf8.Length; i++)
        {
            if (utf8[i] == (byte)'\n')
            {
                lineStarts.Add(i + 1);
            }
        }

        (int, int) Locate(long offset)
        {
            var index = lineStarts.BinarySearch((int)offset);
            var line = index >= 0 ? index : ~index - 1;
            var column = 1;
            for (var i = lineStarts[line]; i < offset; i++)
            {
                if ((utf8[i] & 0xC0) != 0x80)
                {
                    column++;
                }
            }

            return (line + 1, column);
        }

        var reader = new Utf8JsonReader(utf8, new JsonReaderOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        var stack = new Stack<Frame>();
        string? pendingProperty = null;
        try
        {
            while (reader.Read())
            {
                string ValuePath()
                {
                    if (stack.Count == 0)
                    {
                        return "$";
                    }

                    var frame = stack.Peek();
                    if (frame.IsArray)
                    {
                        var path = $"{frame.Path}[{frame.Index}]";
                        frame.Index++;
                        return path;
                    }

                    return $"{frame.Path}.{pendingProperty}";
                }

                switch (reader.TokenType)
                {
                    case JsonTokenType.PropertyName:
                        pendingProperty = reader.GetString();
                        break;
                    case JsonTokenType.StartObject:
                    case JsonTokenType.StartArray:
                        var containerPath = ValuePath();
                        map.locations.TryAdd(containerPath, Locate(reader.TokenStartIndex));
                        stack.Push(new Frame(containerPath, reader.TokenType == JsonTokenType.StartArray));
                        break;
                    case JsonTokenType.EndObject:
                    case JsonTokenType.EndArray:
                        stack.Pop();
                        break;
                    default:
                        map.locations.TryAdd(ValuePath(), Locate(reader.TokenStartIndex));
                        break;
                }
            }
        }
        catch (JsonException)
        {
            // The document reader reports syntax errors with their position; the map keeps what it saw.
        }

        return map;
    }

    public (int Line, int Column) Find(string path)
    {
        var probe = path;
        while (true)
        {
            if (locations.TryGetValue(probe, out var location))
            {
                return location;
            }

            var cut = Math.Max(probe.LastIndexOf('.'), probe.LastIndexOf('['));
            if (cut <= 0)
            {
                return (0, 0);
            }

            probe = probe[..cut];
        }
    }

    private sealed class Frame(string path, bool isArray)
    {
        public string Path { get; } = path;

        public bool IsArray { get; } = isArray;

        public int Index { get; set; }
    }
}
