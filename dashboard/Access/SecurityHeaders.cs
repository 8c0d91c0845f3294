using Microsoft.AspNetCore.Http;

namespace LoopWatch.Dashboard.Access;

/// <summary>Headers on every answer: a content security policy without inline script, no framing, no MIME sniffing.</summary>
public static class SecurityHeaders
{
    /// <summary>The policy: everything from this origin only; inline SVG needs no exception.</summary>
    public const string ContentSecurityPolicy =
        "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data:; object-src 'none'; base-uri 'none'; form-action 'self'; frame-ancestors 'none'";

    /// <summary>Adds the headers before the response starts.</summary>
    public static Task Apply(HttpContext context, Func<Task> next)
    {
        var h = context.Response.Headers;
        h.ContentSecurityPolicy = ContentSecurityPolicy;
        h.XFrameOptions = "DENY";
        h.XContentTypeOptions = "nosniff";
        h["Referrer-Policy"] = "no-referrer";
        return next();
    }
}
