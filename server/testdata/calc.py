"""Drive LibreOffice Calc, headless, over UNO for the server's tests.

Reads a job as JSON on standard input:

    {"cells": {"A2": 6, "B2": 330, "C2": "=NUMBERVALUE(...)"},
     "save": {"/tmp/dir/sheet.ods": "calc8", "/tmp/dir/sheet.xlsx": "Calc MS Excel 2007 XML"},
     "reopen": [{"links": 0, "trusted": ["file:///tmp/dir/"]}]}

Numbers become cell values; text starting with "=" is entered as a formula
the way a user types it (the FormulaLocal property: the separators and
decimal point of the locale Calc runs in, which LC_ALL sets); other text
is entered as text. Every cell is then recalculated (calculateAll), and
each cell's shown text, value and error code (0: none; 540: external data
blocked; 502: invalid argument) is written as JSON on standard output:

    {"version": "7.4.7.2", "seconds": 0.05,
     "cells": {"C2": {"text": "3122.2", "value": 3122.2, "error": 0}},
     "reopened": [{"file": ..., "setting": ..., "cells": {...}}]}

The sheet is then saved to each file of "save" (path: filter name), and
for each setting of "reopen" Calc's "Update links when opening" is set
(Link: 0 always from trusted locations, 1 never, 2 on request) and its
trusted file locations (SecureURL: folder URLs), and each saved file is
opened again from disk and read without a recalculation, as a user
reopening it would see it.

soffice runs with a profile of its own in a temporary folder, so the
user's settings are neither read nor changed, and is stopped at the end.
"""

import json
import os
import shutil
import subprocess
import sys
import tempfile
import time

import uno
from com.sun.star.beans import PropertyValue


def prop(name, value):
    p = PropertyValue()
    p.Name = name
    p.Value = value
    return p


def connect(pipe, proc):
    local = uno.getComponentContext()
    resolver = local.ServiceManager.createInstanceWithContext("com.sun.star.bridge.UnoUrlResolver", local)
    deadline = time.time() + 180
    while True:
        try:
            return resolver.resolve("uno:pipe,name=%s;urp;StarOffice.ComponentContext" % pipe)
        except Exception:
            if proc.poll() is not None or time.time() > deadline:
                raise SystemExit("soffice did not accept a connection (exit %s)" % proc.poll())
            time.sleep(0.25)


def set_config(ctx, path, values):
    provider = ctx.ServiceManager.createInstanceWithContext("com.sun.star.configuration.ConfigurationProvider", ctx)
    access = provider.createInstanceWithArguments("com.sun.star.configuration.ConfigurationUpdateAccess",
                                                  (prop("nodepath", path),))
    for k, v in values.items():
        # A list goes as a typed Any, which only uno.invoke passes on.
        uno.invoke(access, "setPropertyValue", (k, v))
    access.commitChanges()


def read(sheet, names):
    out = {}
    for name in names:
        c = sheet.getCellRangeByName(name)
        out[name] = {"text": c.getString(), "value": c.getValue(), "error": c.getError()}
    return out


def main():
    job = json.load(sys.stdin)
    profile = tempfile.mkdtemp(prefix="steamcell-lo-")
    pipe = "steamcell%d" % os.getpid()
    proc = subprocess.Popen(
        ["soffice", "--headless", "--invisible", "--nologo", "--norestore", "--nodefault", "--nolockcheck",
         "-env:UserInstallation=" + uno.systemPathToFileUrl(profile), "--accept=pipe,name=%s;urp;" % pipe],
        stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    try:
        ctx = connect(pipe, proc)
        smgr = ctx.ServiceManager
        desktop = smgr.createInstanceWithContext("com.sun.star.frame.Desktop", ctx)
        provider = smgr.createInstanceWithContext("com.sun.star.configuration.ConfigurationProvider", ctx)
        about = provider.createInstanceWithArguments("com.sun.star.configuration.ConfigurationAccess",
                                                     (prop("nodepath", "/org.openoffice.Setup/Product"),))
        result = {"version": about.getPropertyValue("ooSetupVersionAboutBox")}

        doc = desktop.loadComponentFromURL("private:factory/scalc", "_blank", 0, (prop("Hidden", True),))
        sheet = doc.Sheets.getByIndex(0)
        cells = job["cells"]
        for name, v in cells.items():
            c = sheet.getCellRangeByName(name)
            if isinstance(v, (int, float)):
                c.setValue(v)
            elif v.startswith("="):
                c.setPropertyValue("FormulaLocal", v)
            else:
                c.setString(v)
        start = time.time()
        doc.calculateAll()
        result["seconds"] = time.time() - start
        result["cells"] = read(sheet, cells.keys())
        saved = []
        for path, filt in job.get("save", {}).items():
            doc.storeToURL(uno.systemPathToFileUrl(path), (prop("FilterName", filt),))
            saved.append(path)
        doc.close(True)
        result["reopened"] = []
        for setting in job.get("reopen", []):
            set_config(ctx, "/org.openoffice.Office.Calc/Content/Update", {"Link": uno.Any("long", setting["links"])})
            set_config(ctx, "/org.openoffice.Office.Common/Security/Scripting",
                       {"SecureURL": uno.Any("[]string", tuple(setting["trusted"]))})
            for path in saved:
                # As a user opens it: links updated as the configuration
                # says (UpdateDocMode ACCORDING_TO_CONFIG; an API load
                # updates none by default).
                d = desktop.loadComponentFromURL(uno.systemPathToFileUrl(path), "_blank", 0,
                                                 (prop("Hidden", True), prop("UpdateDocMode", 2)))
                result["reopened"].append({"file": path, "setting": setting,
                                           "cells": read(d.Sheets.getByIndex(0), cells.keys())})
                d.close(True)
        json.dump(result, sys.stdout)
        try:
            desktop.terminate()
        except Exception:
            pass  # the bridge goes down with soffice
    finally:
        try:
            proc.wait(timeout=60)
        except subprocess.TimeoutExpired:
            proc.kill()
        shutil.rmtree(profile, ignore_errors=True)


if __name__ == "__main__":
    main()
