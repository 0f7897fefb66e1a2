using System.Net;
using System.Text.Json;
using Patchproof.Client.Models;

namespace Patchproof.Client.Services;

/// <summary>Reads an RFC 9457 problem-details answer into an <see cref="ApiProblem"/>, located errors included.</summary>
public static class ProblemReader
{
    /// <summary>Reads the problem in a failed response; a body that is not problem details still gives a readable problem.</summary>
    public static async Task<ApiProblem> ReadAsync(HttpResponseMessage response, CancellationToken cancellationToken)
    {
        var status = (int)response.StatusCode;
        var fallbackTitle = FallbackTitle(response.StatusCode);
        string body;
        try
        {
            body = await response.Content.ReadAsStringAsync(cancellationToken);
        }
        catch (HttpRequestException)
        {
            return new ApiProblem(status, fallbackTitle, null);
        }

        return Parse(status, body, fallbackTitle);
    }

    /// <summary>Parses a problem-details body.</summary>
    /// <param name="status">The HTTP status.</param>
    /// <param name="body">The response body, JSON or not.</param>
    /// <param name="fallbackTitle">The title to use when the body has none.</param>
    public static ApiProblem Parse(int status, string body, string fallbackTitle)
    {
        if (string.IsNullOrWhiteSpace(body))
        {
            return new ApiProblem(status, fallbackTitle, null);
        }

        try
        {
            using var document = JsonDocument.Parse(body);
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object)
            {
                return new ApiProblem(status, fallbackTitle, null);
            }

            var title = root.TryGetProperty("title", out var t) && t.ValueKind == JsonValueKind.String ? t.GetString()! : fallbackTitle;
            var detail = root.TryGetProperty("detail", out var d) && d.ValueKind == JsonValueKind.String ? d.GetString() : null;
            return new ApiProblem(status, title, detail, ReadLocations(root));
        }
        catch (JsonException)
        {
            return new ApiProblem(status, fallbackTitle, body.Length > 300 ? body[..300] : body);
        }
    }

    private static List<string> ReadLocations(JsonElement root)
    {
        var locations = new List<string>();
        // Located errors of one uploaded file come with the file's name beside them, not in each error.
        var file = root.TryGetProperty("file", out var f) && f.ValueKind == JsonValueKind.String && f.GetString() is { Length: > 0 } name ? name + ", " : "";
        if (!root.TryGetProperty("errors", out var errors))
        {
            return locations;
        }

        if (errors.ValueKind == JsonValueKind.Array)
        {
            foreach (var error in errors.EnumerateArray())
            {
                if (error.ValueKind == JsonValueKind.String)
                {
                    locations.Add(error.GetString()!);
                }
                else if (error.ValueKind == JsonValueKind.Object)
                {
                    var line = error.TryGetProperty("line", out var l) && l.TryGetInt32(out var li) ? li : 0;
                    var column = error.TryGetProperty("column", out var c) && c.TryGetInt32(out var ci) ? ci : 0;
                    var message = error.TryGetProperty("message", out var m) ? m.GetString() : error.ToString();
                    locations.Add(line > 0 ? $"{file}line {line}{(column > 0 ? $", column {column}" : "")}: {message}" : message ?? "");
                }
            }
        }
        else if (errors.ValueKind == JsonValueKind.Object)
        {
            foreach (var field in errors.EnumerateObject())
            {
                var messages = field.Value.ValueKind == JsonValueKind.Array
                    ? string.Join(" ", field.Value.EnumerateArray().Select(e => e.ToString()))
                    : field.Value.ToString();
                locations.Add($"{field.Name}: {messages}");
            }
        }

        return locations;
    }

    private static string FallbackTitle(HttpStatusCode status) => status switch
    {
        HttpStatusCode.NotFound => "Not found on the server",
        HttpStatusCode.BadRequest => "The server refused the request",
        HttpStatusCode.Conflict => "The server cannot do that now",
        HttpStatusCode.RequestEntityTooLarge => "The file is too large for the server",
        HttpStatusCode.UnsupportedMediaType => "The server does not take this kind of file",
        HttpStatusCode.UnprocessableEntity => "The server could not use what was sent",
        HttpStatusCode.NotImplemented => "The server cannot do this yet",
        _ => $"The server answered {(int)status}",
    };
}
