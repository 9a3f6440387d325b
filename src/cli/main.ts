console.log("pending")
